CREATE TABLE `app_meta` (
	`key` varchar(64) NOT NULL,
	`value` text NOT NULL,
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `app_meta_key` PRIMARY KEY(`key`)
);
--> statement-breakpoint
CREATE TABLE `attachments` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`shop_id` bigint unsigned NOT NULL,
	`case_id` bigint unsigned NOT NULL,
	`stored_name` char(36) NOT NULL,
	`original_name` varchar(200) NOT NULL,
	`mime` varchar(60) NOT NULL,
	`size` int unsigned NOT NULL,
	`sha256` char(64) NOT NULL,
	`uploaded_by_id` bigint unsigned NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `attachments_id` PRIMARY KEY(`id`),
	CONSTRAINT `attachments_stored` UNIQUE(`stored_name`)
);
--> statement-breakpoint
CREATE TABLE `auth_tokens` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`user_id` bigint unsigned NOT NULL,
	`purpose` enum('invite','reset') NOT NULL,
	`token_hash` char(64) NOT NULL,
	`expires_at` datetime(3) NOT NULL,
	`used_at` datetime(3),
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `auth_tokens_id` PRIMARY KEY(`id`),
	CONSTRAINT `auth_tokens_hash` UNIQUE(`token_hash`)
);
--> statement-breakpoint
CREATE TABLE `case_codes` (
	`case_id` bigint unsigned NOT NULL,
	`code` char(5) NOT NULL,
	`ftb` char(2) NOT NULL DEFAULT '',
	CONSTRAINT `case_codes_case_id_code_ftb_pk` PRIMARY KEY(`case_id`,`code`,`ftb`)
);
--> statement-breakpoint
CREATE TABLE `case_comments` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`case_id` bigint unsigned NOT NULL,
	`author_id` bigint unsigned NOT NULL,
	`kind` enum('comment','returned','submitted','published','confirmed') NOT NULL,
	`body` text NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `case_comments_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `case_revisions` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`case_id` bigint unsigned NOT NULL,
	`version` int NOT NULL,
	`title` varchar(200) NOT NULL,
	`body` longtext NOT NULL,
	`fields` json NOT NULL,
	`author_id` bigint unsigned NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `case_revisions_id` PRIMARY KEY(`id`),
	CONSTRAINT `case_revisions_case_version` UNIQUE(`case_id`,`version`)
);
--> statement-breakpoint
CREATE TABLE `case_tags` (
	`case_id` bigint unsigned NOT NULL,
	`tag` varchar(60) NOT NULL,
	CONSTRAINT `case_tags_case_id_tag_pk` PRIMARY KEY(`case_id`,`tag`)
);
--> statement-breakpoint
CREATE TABLE `cases` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`shop_id` bigint unsigned NOT NULL,
	`slug` varchar(120),
	`title` varchar(200) NOT NULL,
	`body` longtext NOT NULL,
	`platform_id` bigint unsigned,
	`vehicle_id` bigint unsigned,
	`mileage` int unsigned,
	`mileage_unit` enum('km','mi'),
	`visit_date` varchar(10),
	`codes` json NOT NULL,
	`symptoms` json NOT NULL,
	`context` json NOT NULL,
	`root_cause` text,
	`fix` text,
	`cause` varchar(120),
	`status` enum('draft','review','published') NOT NULL DEFAULT 'draft',
	`author_id` bigint unsigned NOT NULL,
	`confirmed_by_id` bigint unsigned,
	`confirmed_at` datetime(3),
	`confirm_note` text,
	`version` int NOT NULL DEFAULT 1,
	`deleted_at` datetime(3),
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `cases_id` PRIMARY KEY(`id`),
	CONSTRAINT `cases_shop_slug` UNIQUE(`shop_id`,`slug`)
);
--> statement-breakpoint
CREATE TABLE `change_log` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`shop_id` bigint unsigned NOT NULL,
	`entity` varchar(20) NOT NULL,
	`entity_id` bigint unsigned NOT NULL,
	`op` enum('upsert','delete') NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `change_log_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `platforms` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`shop_id` bigint unsigned NOT NULL,
	`key` varchar(64),
	`make` varchar(60) NOT NULL,
	`model` varchar(60) NOT NULL,
	`engine` varchar(30) NOT NULL,
	`year_from` smallint NOT NULL,
	`year_to` smallint NOT NULL,
	`cylinders` smallint NOT NULL,
	`layout` enum('inline','V','flat') NOT NULL,
	`banks` json,
	`firing_order` json,
	`fuel` enum('petrol','diesel','hybrid','electric'),
	`induction` enum('natural','turbo','supercharged'),
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `platforms_id` PRIMARY KEY(`id`),
	CONSTRAINT `platforms_shop_key` UNIQUE(`shop_id`,`key`)
);
--> statement-breakpoint
CREATE TABLE `sessions` (
	`session_id` varchar(128) NOT NULL,
	`expires` int unsigned NOT NULL,
	`data` mediumtext,
	CONSTRAINT `sessions_session_id` PRIMARY KEY(`session_id`)
);
--> statement-breakpoint
CREATE TABLE `shops` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`name` varchar(120) NOT NULL,
	`comeback_days` smallint NOT NULL DEFAULT 90,
	`comeback_km` int NOT NULL DEFAULT 3000,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `shops_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `users` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`shop_id` bigint unsigned NOT NULL,
	`name` varchar(120) NOT NULL,
	`email` varchar(254) NOT NULL,
	`role` enum('apprentice','technician','senior','manager') NOT NULL,
	`password_hash` varchar(255),
	`disabled` boolean NOT NULL DEFAULT false,
	`failed_logins` int NOT NULL DEFAULT 0,
	`locked_until` datetime(3),
	`password_changed_at` datetime(3),
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `users_id` PRIMARY KEY(`id`),
	CONSTRAINT `users_email` UNIQUE(`email`)
);
--> statement-breakpoint
CREATE TABLE `vehicles` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`shop_id` bigint unsigned NOT NULL,
	`vin` char(17) NOT NULL,
	`plate` varchar(20),
	`fleet_number` varchar(30),
	`platform_id` bigint unsigned,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `vehicles_id` PRIMARY KEY(`id`),
	CONSTRAINT `vehicles_shop_vin` UNIQUE(`shop_id`,`vin`)
);
--> statement-breakpoint
ALTER TABLE `attachments` ADD CONSTRAINT `attachments_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `attachments` ADD CONSTRAINT `attachments_case_id_cases_id_fk` FOREIGN KEY (`case_id`) REFERENCES `cases`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `attachments` ADD CONSTRAINT `attachments_uploaded_by_id_users_id_fk` FOREIGN KEY (`uploaded_by_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `auth_tokens` ADD CONSTRAINT `auth_tokens_user_id_users_id_fk` FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `case_codes` ADD CONSTRAINT `case_codes_case_id_cases_id_fk` FOREIGN KEY (`case_id`) REFERENCES `cases`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `case_comments` ADD CONSTRAINT `case_comments_case_id_cases_id_fk` FOREIGN KEY (`case_id`) REFERENCES `cases`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `case_comments` ADD CONSTRAINT `case_comments_author_id_users_id_fk` FOREIGN KEY (`author_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `case_revisions` ADD CONSTRAINT `case_revisions_case_id_cases_id_fk` FOREIGN KEY (`case_id`) REFERENCES `cases`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `case_revisions` ADD CONSTRAINT `case_revisions_author_id_users_id_fk` FOREIGN KEY (`author_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `case_tags` ADD CONSTRAINT `case_tags_case_id_cases_id_fk` FOREIGN KEY (`case_id`) REFERENCES `cases`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `cases` ADD CONSTRAINT `cases_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `cases` ADD CONSTRAINT `cases_platform_id_platforms_id_fk` FOREIGN KEY (`platform_id`) REFERENCES `platforms`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `cases` ADD CONSTRAINT `cases_vehicle_id_vehicles_id_fk` FOREIGN KEY (`vehicle_id`) REFERENCES `vehicles`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `cases` ADD CONSTRAINT `cases_author_id_users_id_fk` FOREIGN KEY (`author_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `cases` ADD CONSTRAINT `cases_confirmed_by_id_users_id_fk` FOREIGN KEY (`confirmed_by_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `platforms` ADD CONSTRAINT `platforms_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `users` ADD CONSTRAINT `users_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `vehicles` ADD CONSTRAINT `vehicles_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `vehicles` ADD CONSTRAINT `vehicles_platform_id_platforms_id_fk` FOREIGN KEY (`platform_id`) REFERENCES `platforms`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `attachments_case` ON `attachments` (`case_id`);--> statement-breakpoint
CREATE INDEX `auth_tokens_user` ON `auth_tokens` (`user_id`);--> statement-breakpoint
CREATE INDEX `case_codes_code` ON `case_codes` (`code`);--> statement-breakpoint
CREATE INDEX `case_comments_case` ON `case_comments` (`case_id`);--> statement-breakpoint
CREATE INDEX `case_tags_tag` ON `case_tags` (`tag`);--> statement-breakpoint
CREATE INDEX `cases_shop_updated` ON `cases` (`shop_id`,`updated_at`);--> statement-breakpoint
CREATE INDEX `cases_shop_status` ON `cases` (`shop_id`,`status`);--> statement-breakpoint
CREATE INDEX `cases_shop_platform` ON `cases` (`shop_id`,`platform_id`);--> statement-breakpoint
CREATE INDEX `cases_vehicle` ON `cases` (`vehicle_id`);--> statement-breakpoint
CREATE INDEX `change_log_created` ON `change_log` (`created_at`);--> statement-breakpoint
CREATE INDEX `platforms_shop` ON `platforms` (`shop_id`);--> statement-breakpoint
CREATE INDEX `sessions_expires` ON `sessions` (`expires`);--> statement-breakpoint
CREATE INDEX `users_shop` ON `users` (`shop_id`);