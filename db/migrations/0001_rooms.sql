CREATE TABLE `people` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`room_id` bigint unsigned NOT NULL,
	`person_key` varchar(64) NOT NULL,
	`name` varchar(120) NOT NULL,
	`group_name` varchar(60),
	`email` varchar(254),
	`x` double,
	`y` double,
	`pinned` boolean NOT NULL DEFAULT false,
	`order_index` int NOT NULL,
	CONSTRAINT `people_id` PRIMARY KEY(`id`),
	CONSTRAINT `people_room_key_uq` UNIQUE(`room_id`,`person_key`)
);
--> statement-breakpoint
CREATE TABLE `room_shares` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`room_id` bigint unsigned NOT NULL,
	`user_id` bigint unsigned NOT NULL,
	`role` enum('editor','viewer') NOT NULL,
	`created_at` timestamp(3) NOT NULL DEFAULT (now()),
	CONSTRAINT `room_shares_id` PRIMARY KEY(`id`),
	CONSTRAINT `room_shares_room_user_uq` UNIQUE(`room_id`,`user_id`)
);
--> statement-breakpoint
CREATE TABLE `rooms` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`owner_id` bigint unsigned NOT NULL,
	`name` varchar(120) NOT NULL,
	`description` text NOT NULL,
	`directed` boolean NOT NULL DEFAULT false,
	`minutes_per_hop` double NOT NULL DEFAULT 5,
	`laziness` double NOT NULL DEFAULT 0,
	`mixing` double NOT NULL DEFAULT 0,
	`version` int unsigned NOT NULL DEFAULT 1,
	`created_at` timestamp(3) NOT NULL DEFAULT (now()),
	`updated_at` timestamp(3) NOT NULL DEFAULT (now()) ON UPDATE CURRENT_TIMESTAMP,
	CONSTRAINT `rooms_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `ties` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`room_id` bigint unsigned NOT NULL,
	`source_id` bigint unsigned NOT NULL,
	`target_id` bigint unsigned NOT NULL,
	`strength` double NOT NULL,
	CONSTRAINT `ties_id` PRIMARY KEY(`id`),
	CONSTRAINT `ties_room_pair_uq` UNIQUE(`room_id`,`source_id`,`target_id`)
);
--> statement-breakpoint
ALTER TABLE `people` ADD CONSTRAINT `people_room_id_rooms_id_fk` FOREIGN KEY (`room_id`) REFERENCES `rooms`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `room_shares` ADD CONSTRAINT `room_shares_room_id_rooms_id_fk` FOREIGN KEY (`room_id`) REFERENCES `rooms`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `room_shares` ADD CONSTRAINT `room_shares_user_id_users_id_fk` FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `rooms` ADD CONSTRAINT `rooms_owner_id_users_id_fk` FOREIGN KEY (`owner_id`) REFERENCES `users`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `ties` ADD CONSTRAINT `ties_room_id_rooms_id_fk` FOREIGN KEY (`room_id`) REFERENCES `rooms`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `ties` ADD CONSTRAINT `ties_source_id_people_id_fk` FOREIGN KEY (`source_id`) REFERENCES `people`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `ties` ADD CONSTRAINT `ties_target_id_people_id_fk` FOREIGN KEY (`target_id`) REFERENCES `people`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `people_room_order_idx` ON `people` (`room_id`,`order_index`);--> statement-breakpoint
CREATE INDEX `room_shares_user_idx` ON `room_shares` (`user_id`);--> statement-breakpoint
CREATE INDEX `rooms_owner_idx` ON `rooms` (`owner_id`);--> statement-breakpoint
CREATE INDEX `ties_target_idx` ON `ties` (`target_id`);