ALTER TABLE `design_versions` ADD `approval_state` text DEFAULT 'in_force' NOT NULL;--> statement-breakpoint
ALTER TABLE `design_versions` ADD `based_on_version` integer;--> statement-breakpoint
ALTER TABLE `design_versions` ADD `decided_by` text REFERENCES users(id);--> statement-breakpoint
ALTER TABLE `design_versions` ADD `decided_at` text;--> statement-breakpoint
ALTER TABLE `design_versions` ADD `decision_reason` text;