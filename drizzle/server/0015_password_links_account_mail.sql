CREATE TABLE `account_mail` (
	`id` text PRIMARY KEY NOT NULL,
	`user_id` text NOT NULL,
	`recipient` text NOT NULL,
	`idempotency_key` text NOT NULL,
	`content` text,
	`status` text DEFAULT 'pending' NOT NULL,
	`attempts` integer DEFAULT 0 NOT NULL,
	`created_at` text NOT NULL,
	`next_attempt_at` text NOT NULL,
	`claimed_at` text,
	`last_error` text,
	`message_id` text,
	`sent_at` text,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE restrict,
	CONSTRAINT "account_mail_status_check" CHECK("status" IN ('pending', 'sending', 'sent', 'failed'))
);
--> statement-breakpoint
CREATE UNIQUE INDEX `account_mail_idempotency_key_unique` ON `account_mail` (`idempotency_key`);--> statement-breakpoint
CREATE INDEX `account_mail_due_idx` ON `account_mail` (`status`,`next_attempt_at`);--> statement-breakpoint
CREATE INDEX `account_mail_user_idx` ON `account_mail` (`user_id`,`created_at`);--> statement-breakpoint
CREATE TABLE `password_links` (
	`id` text PRIMARY KEY NOT NULL,
	`user_id` text NOT NULL,
	`purpose` text NOT NULL,
	`token_sha256` text NOT NULL,
	`expires_at` text NOT NULL,
	`used_at` text,
	`created_by` text,
	`created_at` text NOT NULL,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE restrict,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE restrict,
	CONSTRAINT "password_links_purpose_check" CHECK("purpose" IN ('invite', 'reset'))
);
--> statement-breakpoint
CREATE UNIQUE INDEX `password_links_token_sha256_unique` ON `password_links` (`token_sha256`);--> statement-breakpoint
CREATE INDEX `password_links_user_idx` ON `password_links` (`user_id`,`created_at`);