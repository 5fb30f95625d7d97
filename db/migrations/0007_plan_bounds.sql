CREATE TABLE `plan_bounds` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`room_id` bigint unsigned NOT NULL,
	`room_version` int unsigned NOT NULL,
	`k` int unsigned NOT NULL,
	`constraints_key` varchar(190) NOT NULL,
	`lower_bound` double NOT NULL,
	`lower_source` varchar(20) NOT NULL,
	`best_total` double,
	`best_starters` json,
	`updated_at` timestamp(3) NOT NULL DEFAULT (now()) ON UPDATE CURRENT_TIMESTAMP,
	CONSTRAINT `plan_bounds_id` PRIMARY KEY(`id`),
	CONSTRAINT `plan_bounds_key_uq` UNIQUE(`room_id`,`room_version`,`k`,`constraints_key`)
);
--> statement-breakpoint
ALTER TABLE `plans` ADD `no_show` double;--> statement-breakpoint
ALTER TABLE `plans` ADD `absence` json;--> statement-breakpoint
ALTER TABLE `plans` ADD `extras` json;--> statement-breakpoint
ALTER TABLE `plan_bounds` ADD CONSTRAINT `plan_bounds_room_id_rooms_id_fk` FOREIGN KEY (`room_id`) REFERENCES `rooms`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `plan_bounds_room_idx` ON `plan_bounds` (`room_id`);