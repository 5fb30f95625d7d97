ALTER TABLE `people` ADD `manager_key` varchar(64);--> statement-breakpoint
ALTER TABLE `rooms` ADD `org_chart` text;