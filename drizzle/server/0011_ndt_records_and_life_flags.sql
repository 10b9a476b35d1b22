CREATE TABLE `running_log` (
	`id` text PRIMARY KEY NOT NULL,
	`ride_id` text NOT NULL,
	`day` text NOT NULL,
	`cycles` integer,
	`hours` real,
	`note` text,
	`entered_by` text NOT NULL,
	`entered_at` text NOT NULL,
	`source` text NOT NULL,
	FOREIGN KEY (`ride_id`) REFERENCES `rides`(`id`) ON UPDATE no action ON DELETE restrict,
	FOREIGN KEY (`entered_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE restrict,
	CONSTRAINT "running_log_source_check" CHECK("source" IN ('typed', 'csv')),
	CONSTRAINT "running_log_amount_check" CHECK("cycles" IS NOT NULL OR "hours" IS NOT NULL),
	CONSTRAINT "running_log_cycles_check" CHECK("cycles" IS NULL OR "cycles" >= 0),
	CONSTRAINT "running_log_hours_check" CHECK("hours" IS NULL OR ("hours" >= 0 AND "hours" <= 24))
);
--> statement-breakpoint
CREATE UNIQUE INDEX `running_log_ride_day_idx` ON `running_log` (`ride_id`,`day`);--> statement-breakpoint
CREATE INDEX `running_log_day_idx` ON `running_log` (`day`);--> statement-breakpoint
CREATE TABLE `ndt_records` (
	`id` text PRIMARY KEY NOT NULL,
	`ride_id` text NOT NULL,
	`joint` integer NOT NULL,
	`tested_on` text NOT NULL,
	`method` text NOT NULL,
	`technician` text NOT NULL,
	`level` integer NOT NULL,
	`result` text NOT NULL,
	`note` text,
	`report_sha256` text,
	`created_by` text NOT NULL,
	`created_at` text NOT NULL,
	FOREIGN KEY (`ride_id`) REFERENCES `rides`(`id`) ON UPDATE no action ON DELETE restrict,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE restrict,
	CONSTRAINT "ndt_records_method_check" CHECK("method" IN ('VT', 'MT', 'PT', 'UT', 'ET')),
	CONSTRAINT "ndt_records_result_check" CHECK("result" IN ('no_indications', 'acceptable_indications', 'rejectable_indications')),
	CONSTRAINT "ndt_records_level_check" CHECK("level" IN (1, 2, 3)),
	CONSTRAINT "ndt_records_joint_check" CHECK("joint" >= 0),
	CONSTRAINT "ndt_records_report_check" CHECK("report_sha256" IS NULL OR length("report_sha256") = 64)
);
--> statement-breakpoint
CREATE INDEX `ndt_records_ride_idx` ON `ndt_records` (`ride_id`,`joint`,`method`,`tested_on`);--> statement-breakpoint
CREATE INDEX `ndt_records_report_idx` ON `ndt_records` (`report_sha256`);--> statement-breakpoint
CREATE TABLE `ndt_reports` (
	`sha256` text PRIMARY KEY NOT NULL,
	`bytes` integer NOT NULL,
	`stored_at` text NOT NULL,
	`uploaded_by` text NOT NULL,
	FOREIGN KEY (`uploaded_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE restrict
);
--> statement-breakpoint
CREATE TABLE `ride_life_flags` (
	`ride_id` text PRIMARY KEY NOT NULL,
	`ndt_due_on` text,
	`wear_limit_on` text,
	`wear_suggested_on` text,
	`updated_at` text NOT NULL,
	FOREIGN KEY (`ride_id`) REFERENCES `rides`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
ALTER TABLE `review_queue` ADD `ndt_due_on` text;--> statement-breakpoint
ALTER TABLE `review_queue` ADD `wear_limit_on` text;--> statement-breakpoint
ALTER TABLE `review_queue` ADD `wear_suggested_on` text;