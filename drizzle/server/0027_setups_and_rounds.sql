CREATE TABLE `round_plans` (
	`schedule_id` text PRIMARY KEY NOT NULL,
	`planned_on` text NOT NULL,
	`updated_at` text NOT NULL,
	FOREIGN KEY (`schedule_id`) REFERENCES `inspection_schedules`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE TABLE `round_site_order` (
	`day` text NOT NULL,
	`site_id` text NOT NULL,
	`position` integer NOT NULL,
	FOREIGN KEY (`site_id`) REFERENCES `sites`(`id`) ON UPDATE no action ON DELETE cascade,
	CONSTRAINT "round_site_order_position_check" CHECK("position" >= 0)
);
--> statement-breakpoint
CREATE UNIQUE INDEX `round_site_order_day_site_idx` ON `round_site_order` (`day`,`site_id`);--> statement-breakpoint
CREATE TABLE `setup_changes` (
	`id` text PRIMARY KEY NOT NULL,
	`setup_id` text NOT NULL,
	`at` text NOT NULL,
	`by_user` text NOT NULL,
	`from_state` text,
	`to_state` text NOT NULL,
	`note` text,
	FOREIGN KEY (`setup_id`) REFERENCES `setups`(`id`) ON UPDATE no action ON DELETE restrict,
	FOREIGN KEY (`by_user`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE restrict
);
--> statement-breakpoint
CREATE INDEX `setup_changes_setup_idx` ON `setup_changes` (`setup_id`,`at`);--> statement-breakpoint
CREATE TABLE `setups` (
	`id` text PRIMARY KEY NOT NULL,
	`ride_id` text NOT NULL,
	`site_id` text NOT NULL,
	`event_id` text,
	`from_date` text NOT NULL,
	`to_date` text NOT NULL,
	`pitch` text,
	`state` text NOT NULL,
	`created_by` text NOT NULL,
	`created_at` text NOT NULL,
	FOREIGN KEY (`ride_id`) REFERENCES `rides`(`id`) ON UPDATE no action ON DELETE restrict,
	FOREIGN KEY (`site_id`) REFERENCES `sites`(`id`) ON UPDATE no action ON DELETE restrict,
	FOREIGN KEY (`event_id`) REFERENCES `site_events`(`id`) ON UPDATE no action ON DELETE restrict,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE restrict,
	CONSTRAINT "setups_state_check" CHECK("state" IN ('planned', 'set_up', 'cleared', 'pulled_down')),
	CONSTRAINT "setups_dates_check" CHECK("from_date" <= "to_date")
);
--> statement-breakpoint
CREATE INDEX `setups_ride_idx` ON `setups` (`ride_id`,`from_date`);--> statement-breakpoint
CREATE INDEX `setups_site_idx` ON `setups` (`site_id`,`from_date`);--> statement-breakpoint
CREATE TABLE `site_events` (
	`id` text PRIMARY KEY NOT NULL,
	`site_id` text NOT NULL,
	`name` text NOT NULL,
	`from_date` text NOT NULL,
	`to_date` text NOT NULL,
	`created_at` text NOT NULL,
	FOREIGN KEY (`site_id`) REFERENCES `sites`(`id`) ON UPDATE no action ON DELETE restrict,
	CONSTRAINT "site_events_dates_check" CHECK("from_date" <= "to_date")
);
--> statement-breakpoint
CREATE INDEX `site_events_site_idx` ON `site_events` (`site_id`,`from_date`);--> statement-breakpoint
PRAGMA foreign_keys=OFF;--> statement-breakpoint
CREATE TABLE `__new_audit_log` (
	`id` text PRIMARY KEY NOT NULL,
	`at` text NOT NULL,
	`user_id` text,
	`entity` text NOT NULL,
	`entity_id` text NOT NULL,
	`action` text NOT NULL,
	`ride_id` text,
	`summary` text NOT NULL,
	`before` text,
	`after` text,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE restrict,
	CONSTRAINT "audit_log_entity_check" CHECK("entity" IN ('company', 'site', 'ride', 'design', 'checklist_template', 'schedule', 'inspection', 'finding', 'notice', 'corrective_action', 'instrument', 'setting', 'user', 'incident', 'bulletin', 'bulletin_action', 'setup', 'site_event', 'round')),
	CONSTRAINT "audit_log_action_check" CHECK("action" IN ('create', 'update', 'delete', 'invite', 'password_set', 'password_change', 'password_reset', 'disable', 'enable', 'sign_out', 'sign_in_failed'))
);
--> statement-breakpoint
INSERT INTO `__new_audit_log`("id", "at", "user_id", "entity", "entity_id", "action", "ride_id", "summary", "before", "after") SELECT "id", "at", "user_id", "entity", "entity_id", "action", "ride_id", "summary", "before", "after" FROM `audit_log`;--> statement-breakpoint
DROP TABLE `audit_log`;--> statement-breakpoint
ALTER TABLE `__new_audit_log` RENAME TO `audit_log`;--> statement-breakpoint
PRAGMA foreign_keys=ON;--> statement-breakpoint
CREATE INDEX `audit_log_at_idx` ON `audit_log` (`at`);--> statement-breakpoint
CREATE INDEX `audit_log_entity_idx` ON `audit_log` (`entity`,`entity_id`,`at`);--> statement-breakpoint
CREATE INDEX `audit_log_ride_idx` ON `audit_log` (`ride_id`,`at`);--> statement-breakpoint
CREATE INDEX `audit_log_user_idx` ON `audit_log` (`user_id`,`at`);