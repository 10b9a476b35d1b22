CREATE TABLE `incidents` (
	`id` text PRIMARY KEY NOT NULL,
	`ride_id` text NOT NULL,
	`kind` text NOT NULL,
	`occurred_at` text NOT NULL,
	`time_zone` text NOT NULL,
	`what` text NOT NULL,
	`riders_affected` integer NOT NULL,
	`anyone_hurt` integer NOT NULL,
	`stopped_at` text,
	`running_again_at` text,
	`photo_shas` text DEFAULT '[]' NOT NULL,
	`stopped_ride` integer DEFAULT false NOT NULL,
	`reported_by` text NOT NULL,
	`reported_at` text NOT NULL,
	`reviewed_at` text,
	`reviewed_by` text,
	`review_note` text,
	FOREIGN KEY (`ride_id`) REFERENCES `rides`(`id`) ON UPDATE no action ON DELETE restrict,
	FOREIGN KEY (`reported_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE restrict,
	FOREIGN KEY (`reviewed_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE restrict,
	CONSTRAINT "incidents_kind_check" CHECK("kind" IN ('harm', 'near_miss', 'unplanned_stop')),
	CONSTRAINT "incidents_riders_check" CHECK("riders_affected" >= 0),
	CONSTRAINT "incidents_downtime_check" CHECK("stopped_at" IS NULL OR "running_again_at" IS NULL OR "running_again_at" >= "stopped_at"),
	CONSTRAINT "incidents_review_check" CHECK("reviewed_at" IS NULL OR ("reviewed_by" IS NOT NULL AND "review_note" IS NOT NULL))
);
--> statement-breakpoint
CREATE INDEX `incidents_ride_idx` ON `incidents` (`ride_id`,`occurred_at`);--> statement-breakpoint
CREATE INDEX `incidents_open_idx` ON `incidents` (`reviewed_at`,`ride_id`);--> statement-breakpoint
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
	CONSTRAINT "audit_log_entity_check" CHECK("entity" IN ('company', 'site', 'ride', 'design', 'checklist_template', 'schedule', 'inspection', 'finding', 'notice', 'corrective_action', 'instrument', 'setting', 'user', 'incident')),
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
CREATE INDEX `audit_log_user_idx` ON `audit_log` (`user_id`,`at`);--> statement-breakpoint
ALTER TABLE `review_queue` ADD `incident_id` text;--> statement-breakpoint
ALTER TABLE `review_queue` ADD `incident_kind` text;