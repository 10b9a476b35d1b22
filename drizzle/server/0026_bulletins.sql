CREATE TABLE `bulletin_actions` (
	`id` text PRIMARY KEY NOT NULL,
	`bulletin_id` text NOT NULL,
	`ride_id` text NOT NULL,
	`outcome` text NOT NULL,
	`on` text NOT NULL,
	`by_user_id` text NOT NULL,
	`note` text,
	`inspection_id` text,
	`recorded_at` text NOT NULL,
	FOREIGN KEY (`bulletin_id`) REFERENCES `bulletins`(`id`) ON UPDATE no action ON DELETE restrict,
	FOREIGN KEY (`ride_id`) REFERENCES `rides`(`id`) ON UPDATE no action ON DELETE restrict,
	FOREIGN KEY (`by_user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE restrict,
	FOREIGN KEY (`inspection_id`) REFERENCES `inspections`(`id`) ON UPDATE no action ON DELETE restrict,
	CONSTRAINT "bulletin_actions_outcome_check" CHECK("outcome" IN ('done', 'not_done'))
);
--> statement-breakpoint
CREATE INDEX `bulletin_actions_ride_idx` ON `bulletin_actions` (`ride_id`,`bulletin_id`);--> statement-breakpoint
CREATE INDEX `bulletin_actions_bulletin_idx` ON `bulletin_actions` (`bulletin_id`);--> statement-breakpoint
CREATE INDEX `bulletin_actions_recorded_idx` ON `bulletin_actions` (`recorded_at`);--> statement-breakpoint
CREATE TABLE `bulletin_models` (
	`bulletin_id` text NOT NULL,
	`position` integer NOT NULL,
	`model` text NOT NULL,
	`model_key` text NOT NULL,
	PRIMARY KEY(`bulletin_id`, `model_key`),
	FOREIGN KEY (`bulletin_id`) REFERENCES `bulletins`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `bulletin_models_key_idx` ON `bulletin_models` (`model_key`);--> statement-breakpoint
CREATE TABLE `bulletins` (
	`id` text PRIMARY KEY NOT NULL,
	`maker` text NOT NULL,
	`maker_key` text NOT NULL,
	`reference` text NOT NULL,
	`title` text NOT NULL,
	`issued_on` text NOT NULL,
	`severity` text NOT NULL,
	`required_action` text NOT NULL,
	`deadline_on` text,
	`before_next_operation` integer DEFAULT false NOT NULL,
	`document_sha256` text,
	`notes` text,
	`created_at` text NOT NULL,
	`created_by` text NOT NULL,
	`updated_at` text NOT NULL,
	FOREIGN KEY (`document_sha256`) REFERENCES `documents`(`sha256`) ON UPDATE no action ON DELETE restrict,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE restrict,
	CONSTRAINT "bulletins_severity_check" CHECK("severity" IN ('stop_ride', 'safety', 'advice')),
	CONSTRAINT "bulletins_deadline_check" CHECK(NOT ("before_next_operation" = 1 AND "deadline_on" IS NOT NULL))
);
--> statement-breakpoint
CREATE UNIQUE INDEX `bulletins_maker_reference_idx` ON `bulletins` (`maker_key`,`reference`);--> statement-breakpoint
CREATE INDEX `bulletins_document_idx` ON `bulletins` (`document_sha256`);--> statement-breakpoint
PRAGMA foreign_keys=OFF;--> statement-breakpoint
CREATE TABLE `__new_audit_log` (
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
	CONSTRAINT "audit_log_entity_check" CHECK("entity" IN ('company', 'site', 'ride', 'design', 'checklist_template', 'schedule', 'inspection', 'finding', 'notice', 'corrective_action', 'instrument', 'setting', 'user', 'incident', 'bulletin', 'bulletin_action')),
	CONSTRAINT "audit_log_action_check" CHECK("action" IN ('create', 'update', 'delete', 'invite', 'password_set', 'password_change', 'password_reset', 'disable', 'enable', 'sign_out', 'sign_in_failed'))
);
--> statement-breakpoint
INSERT INTO `__new_audit_log`("id", "at", "user_id", "entity", "entity_id", "action", "ride_id", "summary", "before", "after") SELECT "id", "at", "user_id", "entity", "entity_id", "action", "ride_id", "summary", "before", "after" FROM `audit_log`;--> statement-breakpoint
DROP TABLE `audit_log`;--> statement-breakpoint
ALTER TABLE `__new_audit_log` RENAME TO `audit_log`;--> statement-breakpoint
PRAGMA foreign_keys=ON;--> statement-breakpoint
CREATE INDEX `audit_log_at_idx` ON `audit_log` (`at`);--> statement-breakpoint
CREATE INDEX `audit_log_entity_idx` ON `audit_log` (`entity`,`entity_id`,`at`);--> statement-breakpoint
CREATE INDEX `audit_log_ride_idx` ON `audit_log` (`ride_id`,`at`);--> statement-breakpoint
CREATE INDEX `audit_log_user_idx` ON `audit_log` (`user_id`,`at`);