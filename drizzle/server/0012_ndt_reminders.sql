CREATE TABLE `ndt_reminders` (
	`ride_id` text NOT NULL,
	`joint` integer NOT NULL,
	`method` text NOT NULL,
	`due_on` text NOT NULL,
	`stage` text NOT NULL,
	`sent_at` text NOT NULL,
	PRIMARY KEY(`ride_id`, `joint`, `method`, `due_on`, `stage`),
	FOREIGN KEY (`ride_id`) REFERENCES `rides`(`id`) ON UPDATE no action ON DELETE cascade,
	CONSTRAINT "ndt_reminders_stage_check" CHECK("stage" IN ('due_soon', 'past_due')),
	CONSTRAINT "ndt_reminders_method_check" CHECK("method" IN ('VT', 'MT', 'PT', 'UT', 'ET'))
);
