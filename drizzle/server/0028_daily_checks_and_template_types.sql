PRAGMA foreign_keys=OFF;--> statement-breakpoint
CREATE TABLE `__new_inspection_schedules` (
	`id` text PRIMARY KEY NOT NULL,
	`ride_id` text NOT NULL,
	`inspection_type` text NOT NULL,
	`interval_days` integer,
	`last_done_on` text,
	`due_on` text,
	`assigned_to` text,
	`assigned_at` text,
	`notes` text,
	`created_at` text NOT NULL,
	FOREIGN KEY (`ride_id`) REFERENCES `rides`(`id`) ON UPDATE no action ON DELETE restrict,
	FOREIGN KEY (`assigned_to`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE restrict,
	CONSTRAINT "inspection_schedules_type_check" CHECK("inspection_type" IN ('daily_pre_opening', 'periodic', 'annual', 'setup_after_assembly', 'follow_up', 'after_repair')),
	CONSTRAINT "inspection_schedules_interval_check" CHECK("interval_days" IS NULL OR "interval_days" > 0)
);
--> statement-breakpoint
INSERT INTO `__new_inspection_schedules`("id", "ride_id", "inspection_type", "interval_days", "last_done_on", "due_on", "assigned_to", "assigned_at", "notes", "created_at") SELECT "id", "ride_id", "inspection_type", "interval_days", "last_done_on", "due_on", "assigned_to", "assigned_at", "notes", "created_at" FROM `inspection_schedules`;--> statement-breakpoint
DROP TABLE `inspection_schedules`;--> statement-breakpoint
ALTER TABLE `__new_inspection_schedules` RENAME TO `inspection_schedules`;--> statement-breakpoint
PRAGMA foreign_keys=ON;--> statement-breakpoint
CREATE UNIQUE INDEX `inspection_schedules_ride_type_idx` ON `inspection_schedules` (`ride_id`,`inspection_type`);--> statement-breakpoint
CREATE INDEX `inspection_schedules_assignee_idx` ON `inspection_schedules` (`assigned_to`);--> statement-breakpoint
CREATE TABLE `__new_inspections` (
	`id` text PRIMARY KEY NOT NULL,
	`ride_id` text NOT NULL,
	`inspector_id` text NOT NULL,
	`type` text NOT NULL,
	`started_at` text NOT NULL,
	`submitted_at` text NOT NULL,
	`received_at` text NOT NULL,
	`batch_id` text NOT NULL,
	`design_version_id` text,
	`template_id` text,
	`template_version` integer,
	`amends_id` text,
	`record` text NOT NULL,
	`content_sha256` text NOT NULL,
	`failed_items` integer DEFAULT 0 NOT NULL,
	`analysis` text,
	`analysis_note` text,
	`analysis_status` text,
	`analysed_at` text,
	`review_state` text DEFAULT 'submitted' NOT NULL,
	`reviewed_at` text,
	`reviewed_by` text,
	`review_note` text,
	FOREIGN KEY (`ride_id`) REFERENCES `rides`(`id`) ON UPDATE no action ON DELETE restrict,
	FOREIGN KEY (`inspector_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE restrict,
	FOREIGN KEY (`design_version_id`) REFERENCES `design_versions`(`id`) ON UPDATE no action ON DELETE restrict,
	FOREIGN KEY (`amends_id`) REFERENCES `inspections`(`id`) ON UPDATE no action ON DELETE restrict,
	FOREIGN KEY (`reviewed_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE restrict,
	CONSTRAINT "inspections_type_check" CHECK("type" IN ('daily_pre_opening', 'periodic', 'annual', 'setup_after_assembly', 'follow_up', 'after_repair')),
	CONSTRAINT "inspections_review_state_check" CHECK("review_state" IN ('submitted', 'approved', 'returned')),
	CONSTRAINT "inspections_analysis_status_check" CHECK("analysis_status" IS NULL OR "analysis_status" IN ('within', 'near', 'over'))
);
--> statement-breakpoint
INSERT INTO `__new_inspections`("id", "ride_id", "inspector_id", "type", "started_at", "submitted_at", "received_at", "batch_id", "design_version_id", "template_id", "template_version", "amends_id", "record", "content_sha256", "failed_items", "analysis", "analysis_note", "analysis_status", "analysed_at", "review_state", "reviewed_at", "reviewed_by", "review_note") SELECT "id", "ride_id", "inspector_id", "type", "started_at", "submitted_at", "received_at", "batch_id", "design_version_id", "template_id", "template_version", "amends_id", "record", "content_sha256", "failed_items", "analysis", "analysis_note", "analysis_status", "analysed_at", "review_state", "reviewed_at", "reviewed_by", "review_note" FROM `inspections`;--> statement-breakpoint
DROP TABLE `inspections`;--> statement-breakpoint
ALTER TABLE `__new_inspections` RENAME TO `inspections`;--> statement-breakpoint
CREATE INDEX `inspections_ride_submitted_idx` ON `inspections` (`ride_id`,`submitted_at`);--> statement-breakpoint
CREATE INDEX `inspections_inspector_idx` ON `inspections` (`inspector_id`,`submitted_at`);--> statement-breakpoint
CREATE INDEX `inspections_review_idx` ON `inspections` (`review_state`,`analysis_status`,`submitted_at`);--> statement-breakpoint
CREATE INDEX `inspections_reviewed_at_idx` ON `inspections` (`inspector_id`,`reviewed_at`);--> statement-breakpoint
CREATE INDEX `inspections_amends_idx` ON `inspections` (`amends_id`);--> statement-breakpoint
CREATE INDEX `inspections_analysed_at_idx` ON `inspections` (`analysed_at`);--> statement-breakpoint
ALTER TABLE `checklist_templates` ADD `inspection_type` text;--> statement-breakpoint
ALTER TABLE `review_queue` ADD `daily_failed_at` text;--> statement-breakpoint
ALTER TABLE `review_queue` ADD `daily_missed_on` text;