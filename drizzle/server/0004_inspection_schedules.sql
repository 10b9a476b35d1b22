CREATE TABLE `inspection_schedules` (
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
	CONSTRAINT "inspection_schedules_type_check" CHECK("inspection_type" IN ('daily_pre_opening', 'periodic', 'annual', 'setup_after_assembly', 'follow_up')),
	CONSTRAINT "inspection_schedules_interval_check" CHECK("interval_days" IS NULL OR "interval_days" > 0)
);
--> statement-breakpoint
CREATE UNIQUE INDEX `inspection_schedules_ride_type_idx` ON `inspection_schedules` (`ride_id`,`inspection_type`);--> statement-breakpoint
CREATE INDEX `inspection_schedules_assignee_idx` ON `inspection_schedules` (`assigned_to`);