ALTER TABLE `shops` ADD `country` varchar(2);--> statement-breakpoint
ALTER TABLE `shops` ADD `time_zone` varchar(64) DEFAULT 'UTC' NOT NULL;