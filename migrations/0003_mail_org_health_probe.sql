CREATE TABLE `health_probe` (
	`id` integer PRIMARY KEY NOT NULL,
	`checked_at` text NOT NULL
);
--> statement-breakpoint
ALTER TABLE `captured_mail` ADD `org_id` text REFERENCES organisations(id);--> statement-breakpoint
CREATE INDEX `captured_mail_org_idx` ON `captured_mail` (`org_id`,`id`);--> statement-breakpoint
-- Written by hand (backfill): a message captured before this column belongs to the organisation of the person it was sent to (an exact address of its To list); one matching nobody stays without one and is shown to no one.
UPDATE `captured_mail` SET `org_id` = (SELECT `u`.`org_id` FROM `users` `u` WHERE instr(', ' || lower(`captured_mail`.`to_addresses`) || ',', ', ' || `u`.`email` || ',') > 0 LIMIT 1) WHERE `org_id` IS NULL;
