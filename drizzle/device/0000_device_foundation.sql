CREATE TABLE `assignments` (
	`id` text PRIMARY KEY NOT NULL,
	`ride_id` text NOT NULL,
	`json` text NOT NULL,
	`updated_at` text NOT NULL
);
--> statement-breakpoint
CREATE INDEX `assignments_ride_idx` ON `assignments` (`ride_id`);--> statement-breakpoint
CREATE TABLE `cached_checklist_templates` (
	`id` text PRIMARY KEY NOT NULL,
	`ride_class` text NOT NULL,
	`json` text NOT NULL,
	`updated_at` text NOT NULL
);
--> statement-breakpoint
CREATE INDEX `cached_checklist_templates_class_idx` ON `cached_checklist_templates` (`ride_class`);--> statement-breakpoint
CREATE TABLE `cached_design_versions` (
	`id` text PRIMARY KEY NOT NULL,
	`ride_id` text NOT NULL,
	`version` integer NOT NULL,
	`json` text NOT NULL
);
--> statement-breakpoint
CREATE INDEX `cached_design_versions_ride_idx` ON `cached_design_versions` (`ride_id`,`version`);--> statement-breakpoint
CREATE TABLE `cached_rides` (
	`id` text PRIMARY KEY NOT NULL,
	`json` text NOT NULL,
	`updated_at` text NOT NULL
);
--> statement-breakpoint
CREATE TABLE `decisions` (
	`inspection_id` text PRIMARY KEY NOT NULL,
	`json` text NOT NULL,
	`updated_at` text NOT NULL
);
--> statement-breakpoint
CREATE TABLE `drafts` (
	`id` text PRIMARY KEY NOT NULL,
	`ride_id` text NOT NULL,
	`json` text NOT NULL,
	`created_at` text NOT NULL,
	`updated_at` text NOT NULL
);
--> statement-breakpoint
CREATE INDEX `drafts_updated_idx` ON `drafts` (`updated_at`);--> statement-breakpoint
CREATE TABLE `outbox` (
	`id` text PRIMARY KEY NOT NULL,
	`kind` text NOT NULL,
	`json` text NOT NULL,
	`state` text NOT NULL,
	`attempts` integer DEFAULT 0 NOT NULL,
	`last_error` text,
	`issues` text,
	`batch_id` text,
	`next_attempt_at` text,
	`created_at` text NOT NULL,
	`updated_at` text NOT NULL,
	CONSTRAINT "outbox_kind_check" CHECK("kind" IN ('inspection')),
	CONSTRAINT "outbox_state_check" CHECK("state" IN ('queued', 'sending', 'accepted', 'rejected')),
	CONSTRAINT "outbox_attempts_check" CHECK("attempts" >= 0)
);
--> statement-breakpoint
CREATE INDEX `outbox_state_idx` ON `outbox` (`state`,`next_attempt_at`);--> statement-breakpoint
CREATE INDEX `outbox_batch_idx` ON `outbox` (`batch_id`);--> statement-breakpoint
CREATE TABLE `photo_blobs` (
	`sha256` text PRIMARY KEY NOT NULL,
	`mime` text NOT NULL,
	`bytes` integer NOT NULL,
	`data` text NOT NULL,
	`upload_state` text NOT NULL,
	`uploaded_bytes` integer DEFAULT 0 NOT NULL,
	`attempts` integer DEFAULT 0 NOT NULL,
	`last_error` text,
	`next_attempt_at` text,
	`created_at` text NOT NULL,
	`updated_at` text NOT NULL,
	CONSTRAINT "photo_blobs_state_check" CHECK("upload_state" IN ('local', 'pending', 'uploading', 'uploaded', 'rejected')),
	CONSTRAINT "photo_blobs_sha_check" CHECK(length("sha256") = 64),
	CONSTRAINT "photo_blobs_bytes_check" CHECK("bytes" > 0)
);
--> statement-breakpoint
CREATE INDEX `photo_blobs_state_idx` ON `photo_blobs` (`upload_state`);--> statement-breakpoint
CREATE TABLE `sync_meta` (
	`key` text PRIMARY KEY NOT NULL,
	`value` text NOT NULL
);
