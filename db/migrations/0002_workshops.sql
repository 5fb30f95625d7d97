CREATE TABLE `participant_links` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`participant_id` bigint unsigned NOT NULL,
	`token_hash` varchar(64) NOT NULL,
	`channel` enum('email','sheet','join') NOT NULL,
	`expires_at` timestamp(3) NOT NULL,
	`revoked_at` timestamp(3),
	`last_used_at` timestamp(3),
	`created_at` timestamp(3) NOT NULL DEFAULT (now()),
	CONSTRAINT `participant_links_id` PRIMARY KEY(`id`),
	CONSTRAINT `participant_links_hash_uq` UNIQUE(`token_hash`)
);
--> statement-breakpoint
CREATE TABLE `survey_nominations` (
	`participant_id` bigint unsigned NOT NULL,
	`nominee_id` bigint unsigned NOT NULL,
	`level` enum('often','weekly','sometimes') NOT NULL,
	CONSTRAINT `survey_nominations_participant_id_nominee_id_pk` PRIMARY KEY(`participant_id`,`nominee_id`)
);
--> statement-breakpoint
CREATE TABLE `survey_responses` (
	`participant_id` bigint unsigned NOT NULL,
	`consented_at` timestamp(3) NOT NULL,
	`version` int NOT NULL DEFAULT 0,
	`submitted_at` timestamp(3),
	`updated_at` timestamp(3) NOT NULL DEFAULT (now()) ON UPDATE CURRENT_TIMESTAMP,
	CONSTRAINT `survey_responses_participant_id` PRIMARY KEY(`participant_id`)
);
--> statement-breakpoint
CREATE TABLE `workshop_facilitators` (
	`workshop_id` bigint unsigned NOT NULL,
	`user_id` bigint unsigned NOT NULL,
	`created_at` timestamp(3) NOT NULL DEFAULT (now()),
	CONSTRAINT `workshop_facilitators_workshop_id_user_id_pk` PRIMARY KEY(`workshop_id`,`user_id`)
);
--> statement-breakpoint
CREATE TABLE `workshop_participants` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`workshop_id` bigint unsigned NOT NULL,
	`name` varchar(120) NOT NULL,
	`email` varchar(254),
	`person_id` varchar(64),
	`claimed_at` timestamp(3),
	`created_at` timestamp(3) NOT NULL DEFAULT (now()),
	CONSTRAINT `workshop_participants_id` PRIMARY KEY(`id`),
	CONSTRAINT `workshop_participants_name_uq` UNIQUE(`workshop_id`,`name`)
);
--> statement-breakpoint
CREATE TABLE `workshops` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`owner_id` bigint unsigned NOT NULL,
	`title` varchar(160) NOT NULL,
	`session_date` varchar(10) NOT NULL,
	`room_id` bigint unsigned,
	`status` enum('draft','collecting','running','debrief','closed') NOT NULL DEFAULT 'draft',
	`nomination_limit` int NOT NULL DEFAULT 5,
	`link_days` int NOT NULL DEFAULT 30,
	`show_starters` boolean NOT NULL DEFAULT false,
	`join_code_hash` varchar(64),
	`join_code_expires_at` timestamp(3),
	`debrief` json,
	`created_at` timestamp(3) NOT NULL DEFAULT (now()),
	`updated_at` timestamp(3) NOT NULL DEFAULT (now()) ON UPDATE CURRENT_TIMESTAMP,
	CONSTRAINT `workshops_id` PRIMARY KEY(`id`),
	CONSTRAINT `workshops_join_code_uq` UNIQUE(`join_code_hash`)
);
--> statement-breakpoint
ALTER TABLE `participant_links` ADD CONSTRAINT `participant_links_participant_id_workshop_participants_id_fk` FOREIGN KEY (`participant_id`) REFERENCES `workshop_participants`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `survey_nominations` ADD CONSTRAINT `survey_nominations_participant_id_workshop_participants_id_fk` FOREIGN KEY (`participant_id`) REFERENCES `workshop_participants`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `survey_nominations` ADD CONSTRAINT `survey_nominations_nominee_id_workshop_participants_id_fk` FOREIGN KEY (`nominee_id`) REFERENCES `workshop_participants`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `survey_responses` ADD CONSTRAINT `survey_responses_participant_id_workshop_participants_id_fk` FOREIGN KEY (`participant_id`) REFERENCES `workshop_participants`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `workshop_facilitators` ADD CONSTRAINT `workshop_facilitators_workshop_id_workshops_id_fk` FOREIGN KEY (`workshop_id`) REFERENCES `workshops`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `workshop_facilitators` ADD CONSTRAINT `workshop_facilitators_user_id_users_id_fk` FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `workshop_participants` ADD CONSTRAINT `workshop_participants_workshop_id_workshops_id_fk` FOREIGN KEY (`workshop_id`) REFERENCES `workshops`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `workshops` ADD CONSTRAINT `workshops_owner_id_users_id_fk` FOREIGN KEY (`owner_id`) REFERENCES `users`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `participant_links_participant_idx` ON `participant_links` (`participant_id`);--> statement-breakpoint
CREATE INDEX `survey_nominations_nominee_idx` ON `survey_nominations` (`nominee_id`);--> statement-breakpoint
CREATE INDEX `workshop_facilitators_user_idx` ON `workshop_facilitators` (`user_id`);--> statement-breakpoint
CREATE INDEX `workshops_owner_idx` ON `workshops` (`owner_id`);