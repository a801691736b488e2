CREATE TABLE `rate_limits` (
	`rate_key` varchar(191) NOT NULL,
	`hits` int unsigned NOT NULL,
	`reset_at` datetime(3) NOT NULL,
	CONSTRAINT `rate_limits_rate_key` PRIMARY KEY(`rate_key`)
);
--> statement-breakpoint
CREATE INDEX `rate_limits_reset` ON `rate_limits` (`reset_at`);