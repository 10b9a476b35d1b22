CREATE TABLE `ride_status_changes` (
	`id` text PRIMARY KEY NOT NULL,
	`ride_id` text NOT NULL,
	`at` text NOT NULL,
	`by_user` text NOT NULL,
	`event` text NOT NULL,
	`from_status` text NOT NULL,
	`to_status` text NOT NULL,
	`override` integer DEFAULT false NOT NULL,
	`reason` text,
	`inspection_id` text,
	`finding_id` text,
	`notice_id` text,
	FOREIGN KEY (`ride_id`) REFERENCES `rides`(`id`) ON UPDATE no action ON DELETE restrict,
	FOREIGN KEY (`by_user`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE restrict,
	FOREIGN KEY (`inspection_id`) REFERENCES `inspections`(`id`) ON UPDATE no action ON DELETE restrict
);
--> statement-breakpoint
CREATE INDEX `ride_status_changes_ride_idx` ON `ride_status_changes` (`ride_id`,`at`);--> statement-breakpoint
ALTER TABLE `findings` ADD `ride_number` integer;--> statement-breakpoint
ALTER TABLE `findings` ADD `close_evidence` text;