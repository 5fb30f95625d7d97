ALTER TABLE `rooms` ADD `people_count` int unsigned DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE `rooms` ADD `ties_count` int unsigned DEFAULT 0 NOT NULL;--> statement-breakpoint
UPDATE `rooms` SET `people_count` = (SELECT COUNT(*) FROM `people` WHERE `people`.`room_id` = `rooms`.`id`), `ties_count` = (SELECT COUNT(*) FROM `ties` WHERE `ties`.`room_id` = `rooms`.`id`);