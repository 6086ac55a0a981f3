CREATE TABLE `amendments` (
	`id` text PRIMARY KEY NOT NULL,
	`venue_id` text NOT NULL,
	`sign_off_id` text NOT NULL,
	`amended_by` text NOT NULL,
	`amended_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ','now')) NOT NULL,
	FOREIGN KEY (`venue_id`) REFERENCES `venues`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`sign_off_id`) REFERENCES `sign_offs`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`amended_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `amendments_venue_idx` ON `amendments` (`venue_id`);--> statement-breakpoint
CREATE TABLE `incident_swaps` (
	`id` text PRIMARY KEY NOT NULL,
	`incident_id` text NOT NULL,
	`position_id` text NOT NULL,
	`removed_equipment_id` text,
	`replacement_equipment_id` text NOT NULL,
	`spare_position_id` text NOT NULL,
	`spare_tested` integer NOT NULL,
	`created_by` text NOT NULL,
	`created_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ','now')) NOT NULL,
	FOREIGN KEY (`incident_id`) REFERENCES `incidents`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`position_id`) REFERENCES `positions`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`removed_equipment_id`) REFERENCES `equipment`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`replacement_equipment_id`) REFERENCES `equipment`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`spare_position_id`) REFERENCES `positions`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `incident_swaps_incident_idx` ON `incident_swaps` (`incident_id`);--> statement-breakpoint
CREATE INDEX `incident_swaps_position_idx` ON `incident_swaps` (`position_id`);--> statement-breakpoint
CREATE TABLE `incidents` (
	`id` text PRIMARY KEY NOT NULL,
	`venue_id` text NOT NULL,
	`strip_id` text NOT NULL,
	`position_id` text,
	`equipment_id` text,
	`symptom` text NOT NULL,
	`status` text DEFAULT 'open' NOT NULL,
	`client_id` text,
	`opened_by` text NOT NULL,
	`opened_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ','now')) NOT NULL,
	`resolved_at` text,
	`resolved_by` text,
	`amendment_id` text,
	FOREIGN KEY (`venue_id`) REFERENCES `venues`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`strip_id`) REFERENCES `strips`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`position_id`) REFERENCES `positions`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`equipment_id`) REFERENCES `equipment`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`opened_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`resolved_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`amendment_id`) REFERENCES `amendments`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `incidents_venue_idx` ON `incidents` (`venue_id`);--> statement-breakpoint
CREATE INDEX `incidents_strip_idx` ON `incidents` (`strip_id`);--> statement-breakpoint
CREATE UNIQUE INDEX `incidents_client_id` ON `incidents` (`client_id`);--> statement-breakpoint
ALTER TABLE `equipment` ADD `to_inspect_incident_id` text;--> statement-breakpoint
ALTER TABLE `strips` ADD `out_of_service_since` text;--> statement-breakpoint
ALTER TABLE `strips` ADD `spare_pool` integer DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE `certificates` ADD `superseded_pending_since` text;--> statement-breakpoint
ALTER TABLE `certificates` ADD `successor_id` text;--> statement-breakpoint
ALTER TABLE `certificates` ADD `amendment_id` text;