CREATE TABLE `companies` (
	`id` text PRIMARY KEY NOT NULL,
	`kind` text NOT NULL,
	`name` text NOT NULL,
	`notice_emails` text DEFAULT '[]' NOT NULL,
	`phone` text,
	`created_at` text NOT NULL,
	CONSTRAINT "companies_kind_check" CHECK("kind" IN ('inspection_body', 'operator'))
);
--> statement-breakpoint
CREATE TABLE `rides` (
	`id` text PRIMARY KEY NOT NULL,
	`name` text NOT NULL,
	`ride_class` text NOT NULL,
	`description` text,
	`maker` text,
	`model` text,
	`serial` text,
	`year` integer,
	`site_id` text,
	`operator_company_id` text NOT NULL,
	`status` text DEFAULT 'in_service' NOT NULL,
	`status_reason` text,
	`status_since` text NOT NULL,
	`created_at` text NOT NULL,
	FOREIGN KEY (`site_id`) REFERENCES `sites`(`id`) ON UPDATE no action ON DELETE restrict,
	FOREIGN KEY (`operator_company_id`) REFERENCES `companies`(`id`) ON UPDATE no action ON DELETE restrict,
	CONSTRAINT "rides_class_check" CHECK("ride_class" IN ('pendulum_swing', 'rotating_arm', 'wheel', 'swing_carousel', 'other')),
	CONSTRAINT "rides_status_check" CHECK("status" IN ('in_service', 'restricted', 'out_of_service')),
	CONSTRAINT "rides_status_reason_check" CHECK("status" = 'in_service' OR "status_reason" IS NOT NULL)
);
--> statement-breakpoint
CREATE INDEX `rides_operator_company_idx` ON `rides` (`operator_company_id`);--> statement-breakpoint
CREATE INDEX `rides_site_idx` ON `rides` (`site_id`);--> statement-breakpoint
CREATE TABLE `sites` (
	`id` text PRIMARY KEY NOT NULL,
	`name` text NOT NULL,
	`kind` text NOT NULL,
	`address` text,
	`locality` text,
	`operator_company_id` text NOT NULL,
	`created_at` text NOT NULL,
	FOREIGN KEY (`operator_company_id`) REFERENCES `companies`(`id`) ON UPDATE no action ON DELETE restrict,
	CONSTRAINT "sites_kind_check" CHECK("kind" IN ('park', 'fairground', 'travelling_setup'))
);
--> statement-breakpoint
CREATE INDEX `sites_operator_company_idx` ON `sites` (`operator_company_id`);--> statement-breakpoint
CREATE TABLE `users` (
	`id` text PRIMARY KEY NOT NULL,
	`email` text NOT NULL,
	`name` text NOT NULL,
	`role` text NOT NULL,
	`password_hash` text NOT NULL,
	`company_id` text,
	`created_at` text NOT NULL,
	`disabled_at` text,
	FOREIGN KEY (`company_id`) REFERENCES `companies`(`id`) ON UPDATE no action ON DELETE restrict,
	CONSTRAINT "users_role_check" CHECK("role" IN ('inspector', 'supervisor', 'operator', 'admin')),
	CONSTRAINT "users_email_lowercase_check" CHECK("email" = lower("email")),
	CONSTRAINT "users_operator_company_check" CHECK("role" <> 'operator' OR "company_id" IS NOT NULL)
);
--> statement-breakpoint
CREATE UNIQUE INDEX `users_email_unique` ON `users` (`email`);--> statement-breakpoint
CREATE INDEX `users_company_idx` ON `users` (`company_id`);