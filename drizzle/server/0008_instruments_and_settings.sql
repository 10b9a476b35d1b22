CREATE TABLE `instruments` (
	`id` text PRIMARY KEY NOT NULL,
	`name` text NOT NULL,
	`serial` text NOT NULL,
	`method` text NOT NULL,
	`kinds` text NOT NULL,
	`calibrated_on` text,
	`calibration_due_on` text,
	`notes` text,
	`retired_at` text,
	`created_at` text NOT NULL,
	`updated_at` text NOT NULL,
	CONSTRAINT "instruments_method_check" CHECK("method" IN ('stopwatch', 'tachometer', 'micrometer', 'dial_indicator', 'gauge', 'other')),
	CONSTRAINT "instruments_dates_check" CHECK("calibrated_on" IS NULL OR "calibration_due_on" IS NULL OR "calibration_due_on" >= "calibrated_on")
);
--> statement-breakpoint
CREATE INDEX `instruments_name_idx` ON `instruments` (`name`);--> statement-breakpoint
CREATE TABLE `settings` (
	`key` text PRIMARY KEY NOT NULL,
	`value` text NOT NULL,
	`updated_at` text NOT NULL,
	`updated_by` text,
	FOREIGN KEY (`updated_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE restrict
);
--> statement-breakpoint
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
	CONSTRAINT "audit_log_entity_check" CHECK("entity" IN ('company', 'site', 'ride', 'design', 'checklist_template', 'schedule', 'inspection', 'finding', 'notice', 'corrective_action', 'instrument', 'setting')),
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