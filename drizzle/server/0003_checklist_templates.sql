CREATE TABLE `checklist_template_versions` (
	`id` text PRIMARY KEY NOT NULL,
	`template_id` text NOT NULL,
	`version` integer NOT NULL,
	`content` text NOT NULL,
	`reason` text NOT NULL,
	`created_by` text NOT NULL,
	`created_at` text NOT NULL,
	FOREIGN KEY (`template_id`) REFERENCES `checklist_templates`(`id`) ON UPDATE no action ON DELETE restrict,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE restrict,
	CONSTRAINT "checklist_template_versions_version_check" CHECK("version" >= 1)
);
--> statement-breakpoint
CREATE UNIQUE INDEX `checklist_template_versions_template_version_idx` ON `checklist_template_versions` (`template_id`,`version`);--> statement-breakpoint
CREATE TABLE `checklist_templates` (
	`id` text PRIMARY KEY NOT NULL,
	`name` text NOT NULL,
	`ride_class` text NOT NULL,
	`created_at` text NOT NULL,
	`archived_at` text,
	CONSTRAINT "checklist_templates_class_check" CHECK("ride_class" IN ('pendulum_swing', 'rotating_arm', 'wheel', 'swing_carousel', 'other'))
);
--> statement-breakpoint
CREATE INDEX `checklist_templates_class_idx` ON `checklist_templates` (`ride_class`,`name`);