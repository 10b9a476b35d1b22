CREATE TABLE `design_versions` (
	`id` text PRIMARY KEY NOT NULL,
	`ride_id` text NOT NULL,
	`version` integer NOT NULL,
	`data` text NOT NULL,
	`reason` text NOT NULL,
	`origin` text NOT NULL,
	`created_by` text NOT NULL,
	`created_at` text NOT NULL,
	FOREIGN KEY (`ride_id`) REFERENCES `rides`(`id`) ON UPDATE no action ON DELETE restrict,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE restrict,
	CONSTRAINT "design_versions_origin_check" CHECK("origin" IN ('editor', 'import_csv', 'import_json', 'seed')),
	CONSTRAINT "design_versions_version_check" CHECK("version" >= 1)
);
--> statement-breakpoint
CREATE UNIQUE INDEX `design_versions_ride_version_idx` ON `design_versions` (`ride_id`,`version`);