CREATE INDEX `faults_step_idx` ON `faults` (`step_id`);--> statement-breakpoint
CREATE INDEX `faults_position_idx` ON `faults` (`position_id`);