CREATE TABLE `inspection_photos` (
	`inspection_id` text NOT NULL,
	`id` text NOT NULL,
	`sha256` text NOT NULL,
	`mime` text NOT NULL,
	`bytes` integer NOT NULL,
	`caption` text NOT NULL,
	`joint` integer,
	`checklist_item_id` text,
	`taken_at` text NOT NULL,
	PRIMARY KEY(`inspection_id`, `id`),
	FOREIGN KEY (`inspection_id`) REFERENCES `inspections`(`id`) ON UPDATE no action ON DELETE cascade,
	CONSTRAINT "inspection_photos_mime_check" CHECK("mime" IN ('image/jpeg', 'image/png', 'image/webp'))
);
--> statement-breakpoint
CREATE INDEX `inspection_photos_sha_idx` ON `inspection_photos` (`sha256`);--> statement-breakpoint
CREATE TABLE `inspection_readings` (
	`inspection_id` text NOT NULL,
	`id` text NOT NULL,
	`ride_id` text NOT NULL,
	`kind` text NOT NULL,
	`joint` integer,
	`label` text NOT NULL,
	`value_si` real NOT NULL,
	`unit` text NOT NULL,
	`method` text NOT NULL,
	`spread_si` real,
	`taken_at` text NOT NULL,
	`note` text,
	PRIMARY KEY(`inspection_id`, `id`),
	FOREIGN KEY (`inspection_id`) REFERENCES `inspections`(`id`) ON UPDATE no action ON DELETE cascade,
	CONSTRAINT "inspection_readings_kind_check" CHECK("kind" IN ('speed', 'period', 'amplitude', 'pin_diameter', 'clearance', 'other')),
	CONSTRAINT "inspection_readings_method_check" CHECK("method" IN ('typed', 'tap_timer', 'stopwatch', 'tachometer', 'micrometer', 'dial_indicator', 'gauge', 'other'))
);
--> statement-breakpoint
CREATE INDEX `inspection_readings_trend_idx` ON `inspection_readings` (`ride_id`,`kind`,`joint`,`taken_at`);--> statement-breakpoint
CREATE TABLE `inspections` (
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
	CONSTRAINT "inspections_type_check" CHECK("type" IN ('daily_pre_opening', 'periodic', 'annual', 'setup_after_assembly', 'follow_up')),
	CONSTRAINT "inspections_review_state_check" CHECK("review_state" IN ('submitted', 'approved', 'returned')),
	CONSTRAINT "inspections_analysis_status_check" CHECK("analysis_status" IS NULL OR "analysis_status" IN ('within', 'near', 'over'))
);
--> statement-breakpoint
CREATE INDEX `inspections_ride_submitted_idx` ON `inspections` (`ride_id`,`submitted_at`);--> statement-breakpoint
CREATE INDEX `inspections_inspector_idx` ON `inspections` (`inspector_id`,`submitted_at`);--> statement-breakpoint
CREATE INDEX `inspections_review_idx` ON `inspections` (`review_state`,`analysis_status`,`submitted_at`);--> statement-breakpoint
CREATE INDEX `inspections_reviewed_at_idx` ON `inspections` (`inspector_id`,`reviewed_at`);--> statement-breakpoint
CREATE INDEX `inspections_amends_idx` ON `inspections` (`amends_id`);--> statement-breakpoint
CREATE INDEX `inspections_analysed_at_idx` ON `inspections` (`analysed_at`);--> statement-breakpoint
CREATE TABLE `photos` (
	`sha256` text PRIMARY KEY NOT NULL,
	`mime` text NOT NULL,
	`bytes` integer NOT NULL,
	`stored_at` text NOT NULL,
	`uploaded_by` text NOT NULL,
	FOREIGN KEY (`uploaded_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE restrict,
	CONSTRAINT "photos_mime_check" CHECK("mime" IN ('image/jpeg', 'image/png', 'image/webp'))
);
--> statement-breakpoint
CREATE TABLE `sync_batches` (
	`user_id` text NOT NULL,
	`batch_id` text NOT NULL,
	`received_at` text NOT NULL,
	`record_count` integer NOT NULL,
	`result` text NOT NULL,
	PRIMARY KEY(`user_id`, `batch_id`),
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade
);
