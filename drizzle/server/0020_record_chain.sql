CREATE TABLE `ledger_entries` (
	`ride_id` text NOT NULL,
	`seq` integer NOT NULL,
	`kind` text NOT NULL,
	`ref_id` text NOT NULL,
	`at` text NOT NULL,
	`record` text NOT NULL,
	`record_hash` text NOT NULL,
	`prev_hash` text NOT NULL,
	`entry_hash` text NOT NULL,
	`server_key_id` text NOT NULL,
	`server_signature` text NOT NULL,
	`device_key_id` text,
	`device_signature` text,
	PRIMARY KEY(`ride_id`, `seq`),
	FOREIGN KEY (`ride_id`) REFERENCES `rides`(`id`) ON UPDATE no action ON DELETE restrict,
	CONSTRAINT "ledger_entries_kind_check" CHECK("kind" IN ('inspection', 'amendment', 'decision', 'finding', 'ndt', 'notice'))
);
--> statement-breakpoint
CREATE INDEX `ledger_entries_ref_idx` ON `ledger_entries` (`ride_id`,`kind`,`ref_id`,`seq`);--> statement-breakpoint
CREATE TABLE `ledger_heads` (
	`ride_id` text PRIMARY KEY NOT NULL,
	`seq` integer NOT NULL,
	`entry_hash` text NOT NULL,
	`signature` text NOT NULL,
	FOREIGN KEY (`ride_id`) REFERENCES `rides`(`id`) ON UPDATE no action ON DELETE restrict
);
