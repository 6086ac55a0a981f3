ALTER TABLE `fault_estimates` ADD `item_length_m` real;--> statement-breakpoint
ALTER TABLE `limit_profiles` ADD `temperature_reference_c` real;
--> statement-breakpoint
-- Hand-written backfill: each earlier estimate gets the item's length when it was made, that is the length before the first cut-out after it, else the item's length now.
UPDATE `fault_estimates` SET `item_length_m` = COALESCE(
  (SELECT r.`length_before_m` FROM `repairs` r JOIN `faults` f ON f.`id` = `fault_estimates`.`fault_id`
    WHERE r.`equipment_id` = f.`equipment_id` AND r.`action` = 'cut-out' AND r.`created_at` > `fault_estimates`.`created_at`
    ORDER BY r.`created_at` LIMIT 1),
  (SELECT e.`length_m` FROM `faults` f JOIN `equipment` e ON e.`id` = f.`equipment_id` WHERE f.`id` = `fault_estimates`.`fault_id`)
);
