ALTER TABLE `jobs` MODIFY COLUMN `kind` enum('plan','rehearsal','proof') NOT NULL;--> statement-breakpoint
ALTER TABLE `plan_bounds` ADD `search_state` json;