CREATE TABLE `readiness_snapshots` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`shop_id` bigint unsigned NOT NULL,
	`case_id` bigint unsigned NOT NULL,
	`label` varchar(80) NOT NULL,
	`mil` boolean,
	`confirmed_codes` smallint,
	`ignition` enum('spark','compression') NOT NULL,
	`monitors` json NOT NULL,
	`model_year` smallint,
	`taken_by_id` bigint unsigned NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `readiness_snapshots_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
ALTER TABLE `shops` ADD `readiness_rule` varchar(32) DEFAULT 'us-common' NOT NULL;--> statement-breakpoint
ALTER TABLE `readiness_snapshots` ADD CONSTRAINT `readiness_snapshots_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `readiness_snapshots` ADD CONSTRAINT `readiness_snapshots_case_id_cases_id_fk` FOREIGN KEY (`case_id`) REFERENCES `cases`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `readiness_snapshots` ADD CONSTRAINT `readiness_snapshots_taken_by_id_users_id_fk` FOREIGN KEY (`taken_by_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `readiness_snapshots_case` ON `readiness_snapshots` (`case_id`,`created_at`);