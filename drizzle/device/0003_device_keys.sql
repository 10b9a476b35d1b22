CREATE TABLE `device_keys` (
	`user_id` text PRIMARY KEY NOT NULL,
	`key_id` text NOT NULL,
	`private_key` text NOT NULL,
	`public_key` text NOT NULL,
	`session_tag` text NOT NULL,
	`created_at` text NOT NULL,
	`registered_at` text
);
--> statement-breakpoint
ALTER TABLE `outbox` ADD `device_key_id` text;--> statement-breakpoint
ALTER TABLE `outbox` ADD `device_signature` text;