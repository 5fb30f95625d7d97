CREATE TABLE `jobs` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`user_id` bigint unsigned NOT NULL,
	`room_id` bigint unsigned NOT NULL,
	`kind` enum('plan','rehearsal') NOT NULL,
	`status` enum('queued','running','done','failed','cancelled','interrupted') NOT NULL DEFAULT 'queued',
	`progress` double NOT NULL DEFAULT 0,
	`message` text,
	`plan_id` bigint unsigned,
	`rehearsal_id` bigint unsigned,
	`idempotency_key` varchar(160),
	`created_at` timestamp(3) NOT NULL DEFAULT (now()),
	`started_at` timestamp(3),
	`finished_at` timestamp(3),
	CONSTRAINT `jobs_id` PRIMARY KEY(`id`),
	CONSTRAINT `jobs_user_key_uq` UNIQUE(`user_id`,`idempotency_key`)
);
--> statement-breakpoint
CREATE TABLE `plans` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`room_id` bigint unsigned NOT NULL,
	`created_by` bigint unsigned NOT NULL,
	`name` varchar(120) NOT NULL,
	`kind` enum('computed','hand-made') NOT NULL,
	`status` enum('computing','ready','failed','cancelled','interrupted') NOT NULL,
	`k` int unsigned NOT NULL,
	`method_requested` varchar(20) NOT NULL,
	`method_used` varchar(20),
	`nu` double,
	`time_limit_seconds` double,
	`must_brief` json NOT NULL,
	`cannot_brief` json NOT NULL,
	`starters` json,
	`total` double,
	`average` double,
	`quality_rank` double,
	`lower_bound` double,
	`gap` double,
	`certified` boolean NOT NULL DEFAULT false,
	`cover_size` int,
	`elapsed_ms` double,
	`people` int unsigned NOT NULL,
	`room_version` int unsigned NOT NULL,
	`settings` json NOT NULL,
	`snapshot` longtext NOT NULL,
	`results` longtext,
	`notes` json NOT NULL,
	`warnings` json NOT NULL,
	`chosen` boolean NOT NULL DEFAULT false,
	`job_id` bigint unsigned,
	`error` text,
	`created_at` timestamp(3) NOT NULL DEFAULT (now()),
	`updated_at` timestamp(3) NOT NULL DEFAULT (now()) ON UPDATE CURRENT_TIMESTAMP,
	CONSTRAINT `plans_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `rehearsals` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`plan_id` bigint unsigned NOT NULL,
	`room_id` bigint unsigned NOT NULL,
	`created_by` bigint unsigned NOT NULL,
	`job_id` bigint unsigned NOT NULL,
	`runs` int unsigned NOT NULL,
	`seed` varchar(64) NOT NULL,
	`rerun_of` bigint unsigned,
	`average` double,
	`average_stderr` double,
	`analytic_average` double,
	`capped` int unsigned,
	`hops` double,
	`hop_cap` int unsigned,
	`elapsed_ms` double,
	`verdict` json,
	`results` longtext,
	`samples` longtext,
	`created_at` timestamp(3) NOT NULL DEFAULT (now()),
	`finished_at` timestamp(3),
	CONSTRAINT `rehearsals_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
ALTER TABLE `jobs` ADD CONSTRAINT `jobs_user_id_users_id_fk` FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `jobs` ADD CONSTRAINT `jobs_room_id_rooms_id_fk` FOREIGN KEY (`room_id`) REFERENCES `rooms`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `plans` ADD CONSTRAINT `plans_room_id_rooms_id_fk` FOREIGN KEY (`room_id`) REFERENCES `rooms`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `plans` ADD CONSTRAINT `plans_created_by_users_id_fk` FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `rehearsals` ADD CONSTRAINT `rehearsals_plan_id_plans_id_fk` FOREIGN KEY (`plan_id`) REFERENCES `plans`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `rehearsals` ADD CONSTRAINT `rehearsals_room_id_rooms_id_fk` FOREIGN KEY (`room_id`) REFERENCES `rooms`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `rehearsals` ADD CONSTRAINT `rehearsals_created_by_users_id_fk` FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `jobs_user_status_idx` ON `jobs` (`user_id`,`status`);--> statement-breakpoint
CREATE INDEX `jobs_status_idx` ON `jobs` (`status`);--> statement-breakpoint
CREATE INDEX `plans_room_idx` ON `plans` (`room_id`,`created_at`);--> statement-breakpoint
CREATE INDEX `rehearsals_room_idx` ON `rehearsals` (`room_id`,`created_at`);--> statement-breakpoint
CREATE INDEX `rehearsals_plan_idx` ON `rehearsals` (`plan_id`);