ALTER TABLE `decisions` ADD `author_id` text;--> statement-breakpoint
ALTER TABLE `drafts` ADD `author_id` text;--> statement-breakpoint
CREATE INDEX `drafts_author_idx` ON `drafts` (`author_id`);--> statement-breakpoint
ALTER TABLE `outbox` ADD `author_id` text;--> statement-breakpoint
CREATE INDEX `outbox_author_idx` ON `outbox` (`author_id`,`state`);--> statement-breakpoint
ALTER TABLE `photo_blobs` ADD `author_id` text;