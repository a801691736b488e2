CREATE TABLE `cause_trees` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`shop_id` bigint unsigned NOT NULL,
	`tree_id` varchar(60) NOT NULL,
	`definition` json NOT NULL,
	`updated_by_id` bigint unsigned NOT NULL,
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `cause_trees_id` PRIMARY KEY(`id`),
	CONSTRAINT `cause_trees_shop_tree` UNIQUE(`shop_id`,`tree_id`)
);
--> statement-breakpoint
CREATE TABLE `digest_runs` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`shop_id` bigint unsigned NOT NULL,
	`period_key` varchar(20) NOT NULL,
	`kind` enum('scheduled','manual') NOT NULL,
	`recipients` int NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `digest_runs_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `walks` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`shop_id` bigint unsigned NOT NULL,
	`user_id` bigint unsigned NOT NULL,
	`platform_id` bigint unsigned,
	`tree_id` varchar(60) NOT NULL,
	`evidence` json NOT NULL,
	`state` json NOT NULL,
	`status` enum('open','finished') NOT NULL DEFAULT 'open',
	`case_id` bigint unsigned,
	`version` int NOT NULL DEFAULT 1,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `walks_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
ALTER TABLE `cause_trees` ADD CONSTRAINT `cause_trees_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `cause_trees` ADD CONSTRAINT `cause_trees_updated_by_id_users_id_fk` FOREIGN KEY (`updated_by_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `digest_runs` ADD CONSTRAINT `digest_runs_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `walks` ADD CONSTRAINT `walks_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `walks` ADD CONSTRAINT `walks_user_id_users_id_fk` FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `walks` ADD CONSTRAINT `walks_platform_id_platforms_id_fk` FOREIGN KEY (`platform_id`) REFERENCES `platforms`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `walks` ADD CONSTRAINT `walks_case_id_cases_id_fk` FOREIGN KEY (`case_id`) REFERENCES `cases`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `digest_runs_shop` ON `digest_runs` (`shop_id`,`created_at`);--> statement-breakpoint
CREATE INDEX `walks_shop_user` ON `walks` (`shop_id`,`user_id`,`updated_at`);