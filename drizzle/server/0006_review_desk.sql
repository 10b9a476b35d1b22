CREATE TABLE `findings` (
	`id` text PRIMARY KEY NOT NULL,
	`inspection_id` text NOT NULL,
	`ride_id` text NOT NULL,
	`number` integer NOT NULL,
	`severity` text NOT NULL,
	`description` text NOT NULL,
	`rule_ref` text,
	`required_action` text,
	`due_on` text,
	`photo_shas` text DEFAULT '[]' NOT NULL,
	`state` text DEFAULT 'open' NOT NULL,
	`state_note` text,
	`created_at` text NOT NULL,
	`created_by` text NOT NULL,
	`updated_at` text NOT NULL,
	`updated_by` text NOT NULL,
	`closed_at` text,
	`closed_by` text,
	FOREIGN KEY (`inspection_id`) REFERENCES `inspections`(`id`) ON UPDATE no action ON DELETE restrict,
	FOREIGN KEY (`ride_id`) REFERENCES `rides`(`id`) ON UPDATE no action ON DELETE restrict,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE restrict,
	FOREIGN KEY (`updated_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE restrict,
	FOREIGN KEY (`closed_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE restrict,
	CONSTRAINT "findings_severity_check" CHECK("severity" IN ('note', 'fix_by_date', 'fix_before_operation', 'stop_now')),
	CONSTRAINT "findings_state_check" CHECK("state" IN ('open', 'action_reported', 'closed'))
);
--> statement-breakpoint
CREATE UNIQUE INDEX `findings_inspection_number_idx` ON `findings` (`inspection_id`,`number`);--> statement-breakpoint
CREATE INDEX `findings_ride_idx` ON `findings` (`ride_id`,`state`,`due_on`);--> statement-breakpoint
CREATE INDEX `findings_open_due_idx` ON `findings` (`state`,`due_on`);--> statement-breakpoint
CREATE TABLE `review_queue` (
	`key` text PRIMARY KEY NOT NULL,
	`kind` text NOT NULL,
	`inspection_id` text,
	`inspection_type` text,
	`ride_id` text NOT NULL,
	`ride_name` text NOT NULL,
	`ride_class` text NOT NULL,
	`ride_status` text NOT NULL,
	`site_id` text,
	`site_name` text,
	`operator_id` text NOT NULL,
	`operator_name` text NOT NULL,
	`inspector_id` text,
	`inspector_name` text,
	`urgency` integer NOT NULL,
	`at` text NOT NULL,
	`analysis_status` text,
	`failed_items` integer DEFAULT 0 NOT NULL,
	`overdue_since` text,
	`findings_past_due` integer DEFAULT 0 NOT NULL,
	`search` text NOT NULL,
	CONSTRAINT "review_queue_urgency_check" CHECK("urgency" BETWEEN 0 AND 5)
);
--> statement-breakpoint
CREATE INDEX `review_queue_urgency_idx` ON `review_queue` (`urgency`,`at`,`key`);--> statement-breakpoint
CREATE INDEX `review_queue_at_idx` ON `review_queue` (`at`,`key`);--> statement-breakpoint
CREATE INDEX `review_queue_ride_name_idx` ON `review_queue` (`ride_name`,`key`);--> statement-breakpoint
CREATE INDEX `review_queue_ride_idx` ON `review_queue` (`ride_id`);--> statement-breakpoint
CREATE INDEX `review_queue_site_idx` ON `review_queue` (`site_id`,`urgency`,`at`);--> statement-breakpoint
CREATE INDEX `review_queue_operator_idx` ON `review_queue` (`operator_id`,`urgency`,`at`);--> statement-breakpoint
CREATE INDEX `review_queue_inspector_idx` ON `review_queue` (`inspector_id`,`urgency`,`at`);--> statement-breakpoint
CREATE INDEX `review_queue_class_idx` ON `review_queue` (`ride_class`,`urgency`,`at`);--> statement-breakpoint
CREATE INDEX `review_queue_status_idx` ON `review_queue` (`ride_status`,`urgency`,`at`);--> statement-breakpoint
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
	CONSTRAINT "audit_log_entity_check" CHECK("entity" IN ('company', 'site', 'ride', 'design', 'checklist_template', 'schedule', 'inspection', 'finding')),
	CONSTRAINT "audit_log_action_check" CHECK("action" IN ('create', 'update', 'delete'))
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