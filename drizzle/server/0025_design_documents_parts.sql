CREATE TABLE `design_documents` (
	`id` text PRIMARY KEY NOT NULL,
	`ride_id` text NOT NULL,
	`design_version_id` text NOT NULL,
	`version` integer NOT NULL,
	`sha256` text NOT NULL,
	`kind` text NOT NULL,
	`title` text NOT NULL,
	`revision` text,
	`issued_on` text,
	`first_version` integer NOT NULL,
	`carried_from_id` text,
	`attached_by` text NOT NULL,
	`attached_at` text NOT NULL,
	`created_at` text NOT NULL,
	`detached_by` text,
	`detached_at` text,
	FOREIGN KEY (`ride_id`) REFERENCES `rides`(`id`) ON UPDATE no action ON DELETE restrict,
	FOREIGN KEY (`design_version_id`) REFERENCES `design_versions`(`id`) ON UPDATE no action ON DELETE restrict,
	FOREIGN KEY (`sha256`) REFERENCES `documents`(`sha256`) ON UPDATE no action ON DELETE restrict,
	FOREIGN KEY (`attached_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE restrict,
	FOREIGN KEY (`detached_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE restrict,
	CONSTRAINT "design_documents_kind_check" CHECK("kind" IN ('design_report', 'makers_manual', 'drawing', 'certificate', 'other')),
	CONSTRAINT "design_documents_version_check" CHECK("version" >= "first_version")
);
--> statement-breakpoint
CREATE INDEX `design_documents_version_idx` ON `design_documents` (`design_version_id`);--> statement-breakpoint
CREATE INDEX `design_documents_ride_idx` ON `design_documents` (`ride_id`,`version`);--> statement-breakpoint
CREATE INDEX `design_documents_sha_idx` ON `design_documents` (`sha256`);--> statement-breakpoint
CREATE TABLE `part_replacement_documents` (
	`replacement_id` text NOT NULL,
	`sha256` text NOT NULL,
	`title` text NOT NULL,
	`position` integer NOT NULL,
	PRIMARY KEY(`replacement_id`, `sha256`),
	FOREIGN KEY (`replacement_id`) REFERENCES `part_replacements`(`id`) ON UPDATE no action ON DELETE restrict,
	FOREIGN KEY (`sha256`) REFERENCES `documents`(`sha256`) ON UPDATE no action ON DELETE restrict
);
--> statement-breakpoint
CREATE INDEX `part_replacement_documents_sha_idx` ON `part_replacement_documents` (`sha256`);--> statement-breakpoint
CREATE TABLE `part_replacements` (
	`id` text PRIMARY KEY NOT NULL,
	`ride_id` text NOT NULL,
	`component` text NOT NULL,
	`joint` integer,
	`pivot_name` text,
	`serial_number` text NOT NULL,
	`maker` text NOT NULL,
	`fitted_on` text NOT NULL,
	`fitted_by` text NOT NULL,
	`replaced_serial` text,
	`note` text,
	`corrects_id` text,
	`created_by` text NOT NULL,
	`created_at` text NOT NULL,
	FOREIGN KEY (`ride_id`) REFERENCES `rides`(`id`) ON UPDATE no action ON DELETE restrict,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE restrict,
	CONSTRAINT "part_replacements_joint_check" CHECK("joint" IS NULL OR "joint" >= 0)
);
--> statement-breakpoint
CREATE INDEX `part_replacements_ride_idx` ON `part_replacements` (`ride_id`,`fitted_on`);