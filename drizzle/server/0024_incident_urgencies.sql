PRAGMA foreign_keys=OFF;--> statement-breakpoint
CREATE TABLE `__new_review_queue` (
	`key` text PRIMARY KEY NOT NULL,
	`kind` text NOT NULL,
	`inspection_id` text,
	`inspection_type` text,
	`ride_id` text NOT NULL,
	`ride_name` text NOT NULL,
	`ride_class` text NOT NULL,
	`ride_status` text NOT NULL,
	`site_id` text,
	`site_name` text,
	`operator_id` text NOT NULL,
	`operator_name` text NOT NULL,
	`inspector_id` text,
	`inspector_name` text,
	`urgency` integer NOT NULL,
	`at` text NOT NULL,
	`day` text DEFAULT '' NOT NULL,
	`analysis_status` text,
	`failed_items` integer DEFAULT 0 NOT NULL,
	`overdue_since` text,
	`findings_past_due` integer DEFAULT 0 NOT NULL,
	`ndt_due_on` text,
	`wear_limit_on` text,
	`wear_suggested_on` text,
	`incident_id` text,
	`incident_kind` text,
	`search` text NOT NULL,
	CONSTRAINT "review_queue_urgency_check" CHECK("urgency" BETWEEN 0 AND 7)
);
--> statement-breakpoint
INSERT INTO `__new_review_queue`("key", "kind", "inspection_id", "inspection_type", "ride_id", "ride_name", "ride_class", "ride_status", "site_id", "site_name", "operator_id", "operator_name", "inspector_id", "inspector_name", "urgency", "at", "day", "analysis_status", "failed_items", "overdue_since", "findings_past_due", "ndt_due_on", "wear_limit_on", "wear_suggested_on", "incident_id", "incident_kind", "search") SELECT "key", "kind", "inspection_id", "inspection_type", "ride_id", "ride_name", "ride_class", "ride_status", "site_id", "site_name", "operator_id", "operator_name", "inspector_id", "inspector_name", "urgency", "at", "day", "analysis_status", "failed_items", "overdue_since", "findings_past_due", "ndt_due_on", "wear_limit_on", "wear_suggested_on", "incident_id", "incident_kind", "search" FROM `review_queue`;--> statement-breakpoint
DROP TABLE `review_queue`;--> statement-breakpoint
ALTER TABLE `__new_review_queue` RENAME TO `review_queue`;--> statement-breakpoint
PRAGMA foreign_keys=ON;--> statement-breakpoint
CREATE INDEX `review_queue_urgency_idx` ON `review_queue` (`urgency`,`at`,`key`);--> statement-breakpoint
CREATE INDEX `review_queue_at_idx` ON `review_queue` (`at`,`key`);--> statement-breakpoint
CREATE INDEX `review_queue_ride_name_idx` ON `review_queue` (`ride_name`,`key`);--> statement-breakpoint
CREATE INDEX `review_queue_ride_idx` ON `review_queue` (`ride_id`);--> statement-breakpoint
CREATE INDEX `review_queue_site_idx` ON `review_queue` (`site_id`,`urgency`,`at`);--> statement-breakpoint
CREATE INDEX `review_queue_operator_idx` ON `review_queue` (`operator_id`,`urgency`,`at`);--> statement-breakpoint
CREATE INDEX `review_queue_inspector_idx` ON `review_queue` (`inspector_id`,`urgency`,`at`);--> statement-breakpoint
CREATE INDEX `review_queue_class_idx` ON `review_queue` (`ride_class`,`urgency`,`at`);--> statement-breakpoint
CREATE INDEX `review_queue_status_idx` ON `review_queue` (`ride_status`,`urgency`,`at`);