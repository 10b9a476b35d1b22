ALTER TABLE `companies` ADD `notice_units` text DEFAULT 'si' NOT NULL;--> statement-breakpoint
ALTER TABLE `companies` ADD `notice_paper` text DEFAULT 'A4' NOT NULL;