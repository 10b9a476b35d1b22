CREATE TABLE `corrective_actions` (
	`id` text PRIMARY KEY NOT NULL,
	`finding_id` text NOT NULL,
	`reported_by` text NOT NULL,
	`reported_at` text NOT NULL,
	`note` text NOT NULL,
	`photo_shas` text DEFAULT '[]' NOT NULL,
	FOREIGN KEY (`finding_id`) REFERENCES `findings`(`id`) ON UPDATE no action ON DELETE restrict,
	FOREIGN KEY (`reported_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE restrict
);
--> statement-breakpoint
CREATE INDEX `corrective_actions_finding_idx` ON `corrective_actions` (`finding_id`,`reported_at`);--> statement-breakpoint
CREATE TABLE `finding_reminders` (
	`finding_id` text NOT NULL,
	`stage` text NOT NULL,
	`sent_at` text NOT NULL,
	PRIMARY KEY(`finding_id`, `stage`),
	FOREIGN KEY (`finding_id`) REFERENCES `findings`(`id`) ON UPDATE no action ON DELETE cascade,
	CONSTRAINT "finding_reminders_stage_check" CHECK("stage" IN ('due_soon', 'past_due'))
);
--> statement-breakpoint
CREATE TABLE `notice_deliveries` (
	`id` text PRIMARY KEY NOT NULL,
	`kind` text DEFAULT 'notice' NOT NULL,
	`notice_id` text,
	`operator_company_id` text NOT NULL,
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
	FOREIGN KEY (`notice_id`) REFERENCES `notices`(`id`) ON UPDATE no action ON DELETE restrict,
	FOREIGN KEY (`operator_company_id`) REFERENCES `companies`(`id`) ON UPDATE no action ON DELETE restrict,
	CONSTRAINT "notice_deliveries_status_check" CHECK("status" IN ('pending', 'sending', 'sent', 'failed')),
	CONSTRAINT "notice_deliveries_kind_check" CHECK("kind" IN ('notice', 'reminder')),
	CONSTRAINT "notice_deliveries_shape_check" CHECK(("kind" = 'notice' AND "notice_id" IS NOT NULL) OR ("kind" = 'reminder' AND "content" IS NOT NULL))
);
--> statement-breakpoint
CREATE UNIQUE INDEX `notice_deliveries_idempotency_key_unique` ON `notice_deliveries` (`idempotency_key`);--> statement-breakpoint
CREATE INDEX `notice_deliveries_due_idx` ON `notice_deliveries` (`status`,`next_attempt_at`);--> statement-breakpoint
CREATE INDEX `notice_deliveries_notice_idx` ON `notice_deliveries` (`notice_id`);--> statement-breakpoint
CREATE INDEX `notice_deliveries_company_idx` ON `notice_deliveries` (`operator_company_id`,`created_at`);--> statement-breakpoint
CREATE TABLE `notice_findings` (
	`notice_id` text NOT NULL,
	`finding_id` text NOT NULL,
	PRIMARY KEY(`notice_id`, `finding_id`),
	FOREIGN KEY (`notice_id`) REFERENCES `notices`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`finding_id`) REFERENCES `findings`(`id`) ON UPDATE no action ON DELETE restrict
);
--> statement-breakpoint
CREATE INDEX `notice_findings_finding_idx` ON `notice_findings` (`finding_id`);--> statement-breakpoint
CREATE TABLE `notices` (
	`id` text PRIMARY KEY NOT NULL,
	`reference` text NOT NULL,
	`year` integer NOT NULL,
	`seq` integer NOT NULL,
	`kind` text NOT NULL,
	`inspection_id` text,
	`ride_id` text NOT NULL,
	`operator_company_id` text NOT NULL,
	`issued_at` text NOT NULL,
	`issued_by` text NOT NULL,
	`document` text NOT NULL,
	`acknowledged_at` text,
	`acknowledged_by` text,
	FOREIGN KEY (`inspection_id`) REFERENCES `inspections`(`id`) ON UPDATE no action ON DELETE restrict,
	FOREIGN KEY (`ride_id`) REFERENCES `rides`(`id`) ON UPDATE no action ON DELETE restrict,
	FOREIGN KEY (`operator_company_id`) REFERENCES `companies`(`id`) ON UPDATE no action ON DELETE restrict,
	FOREIGN KEY (`issued_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE restrict,
	FOREIGN KEY (`acknowledged_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE restrict,
	CONSTRAINT "notices_kind_check" CHECK("kind" IN ('inspection', 'status_change')),
	CONSTRAINT "notices_seq_check" CHECK("seq" >= 1),
	CONSTRAINT "notices_inspection_check" CHECK("kind" <> 'inspection' OR "inspection_id" IS NOT NULL)
);
--> statement-breakpoint
CREATE UNIQUE INDEX `notices_reference_unique` ON `notices` (`reference`);--> statement-breakpoint
CREATE UNIQUE INDEX `notices_year_seq_idx` ON `notices` (`year`,`seq`);--> statement-breakpoint
CREATE UNIQUE INDEX `notices_inspection_idx` ON `notices` (`inspection_id`) WHERE "kind" = 'inspection';--> statement-breakpoint
CREATE INDEX `notices_operator_idx` ON `notices` (`operator_company_id`,`issued_at`);--> statement-breakpoint
CREATE INDEX `notices_ride_idx` ON `notices` (`ride_id`,`issued_at`);--> statement-breakpoint
CREATE INDEX `notices_issued_idx` ON `notices` (`issued_at`);--> statement-breakpoint
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
	CONSTRAINT "audit_log_entity_check" CHECK("entity" IN ('company', 'site', 'ride', 'design', 'checklist_template', 'schedule', 'inspection', 'finding', 'notice', 'corrective_action')),
	CONSTRAINT "audit_log_action_check" CHECK("action" IN ('create', 'update', 'delete'))
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