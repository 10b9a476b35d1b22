CREATE TABLE `audit_log` (
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
	CONSTRAINT "audit_log_entity_check" CHECK("entity" IN ('company', 'site', 'ride', 'design', 'checklist_template', 'schedule')),
	CONSTRAINT "audit_log_action_check" CHECK("action" IN ('create', 'update', 'delete'))
);
--> statement-breakpoint
CREATE INDEX `audit_log_at_idx` ON `audit_log` (`at`);--> statement-breakpoint
CREATE INDEX `audit_log_entity_idx` ON `audit_log` (`entity`,`entity_id`,`at`);--> statement-breakpoint
CREATE INDEX `audit_log_ride_idx` ON `audit_log` (`ride_id`,`at`);--> statement-breakpoint
CREATE INDEX `audit_log_user_idx` ON `audit_log` (`user_id`,`at`);--> statement-breakpoint
ALTER TABLE `companies` ADD `address` text;--> statement-breakpoint
ALTER TABLE `companies` ADD `contacts` text DEFAULT '[]' NOT NULL;--> statement-breakpoint
CREATE INDEX `companies_name_idx` ON `companies` (`name`);--> statement-breakpoint
CREATE INDEX `rides_name_idx` ON `rides` (`name`);--> statement-breakpoint
CREATE INDEX `rides_status_idx` ON `rides` (`status`,`name`);--> statement-breakpoint
CREATE INDEX `rides_class_idx` ON `rides` (`ride_class`,`name`);--> statement-breakpoint
CREATE INDEX `sites_name_idx` ON `sites` (`name`);