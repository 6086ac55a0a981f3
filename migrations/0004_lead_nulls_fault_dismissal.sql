CREATE TABLE `lead_nulls` (
	`id` text PRIMARY KEY NOT NULL,
	`org_id` text NOT NULL,
	`taken_by` text NOT NULL,
	`session_id` text,
	`value_text` text NOT NULL,
	`value_ohm` real NOT NULL,
	`meter` text,
	`taken_at` text NOT NULL,
	`received_at` text NOT NULL,
	FOREIGN KEY (`org_id`) REFERENCES `organisations`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`taken_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `lead_nulls_taken_by_idx` ON `lead_nulls` (`taken_by`);--> statement-breakpoint
ALTER TABLE `faults` ADD `dismissed_by` text REFERENCES users(id);--> statement-breakpoint
ALTER TABLE `faults` ADD `dismissed_at` text;--> statement-breakpoint
ALTER TABLE `faults` ADD `dismissed_reason` text;--> statement-breakpoint
ALTER TABLE `readings` ADD `lead_null_id` text REFERENCES lead_nulls(id);