ALTER TABLE `users` ADD `handle` varchar(40);--> statement-breakpoint
ALTER TABLE `users` ADD CONSTRAINT `users_shop_handle` UNIQUE(`shop_id`,`handle`);