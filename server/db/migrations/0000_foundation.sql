CREATE TABLE `venues` (
	`id` int AUTO_INCREMENT NOT NULL,
	`name` varchar(120) NOT NULL,
	`address` varchar(400) NOT NULL,
	`time_zone` varchar(64) NOT NULL,
	`currency` char(3) NOT NULL,
	`legal_age` int NOT NULL,
	`volume_unit` enum('ml','floz') NOT NULL DEFAULT 'ml',
	`temperature_unit` enum('c','f') NOT NULL DEFAULT 'c',
	`standard_drink_kind` enum('us','uk','au','custom') NOT NULL,
	`standard_drink_grams` double NOT NULL,
	`guest_ethanol_limit_grams` double NOT NULL,
	`cancellation_cutoff_hours` int NOT NULL DEFAULT 24,
	`cautions` text NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `venues_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `auth_tokens` (
	`id` int AUTO_INCREMENT NOT NULL,
	`user_id` int NOT NULL,
	`purpose` enum('invite','reset') NOT NULL,
	`token_hash` char(64) NOT NULL,
	`expires_at` datetime(3) NOT NULL,
	`used_at` datetime(3),
	`created_by_id` int,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `auth_tokens_id` PRIMARY KEY(`id`),
	CONSTRAINT `auth_tokens_hash_uq` UNIQUE(`token_hash`)
);
--> statement-breakpoint
CREATE TABLE `sign_in_throttle` (
	`throttle_key` varchar(300) NOT NULL,
	`failures` int NOT NULL DEFAULT 0,
	`window_started_at` datetime(3) NOT NULL,
	`locked_until` datetime(3),
	CONSTRAINT `sign_in_throttle_throttle_key` PRIMARY KEY(`throttle_key`)
);
--> statement-breakpoint
CREATE TABLE `users` (
	`id` int AUTO_INCREMENT NOT NULL,
	`email` varchar(254) NOT NULL,
	`name` varchar(120) NOT NULL,
	`password_hash` varchar(255),
	`role` enum('manager','host','marketing','guest') NOT NULL,
	`date_of_birth` date,
	`disabled` boolean NOT NULL DEFAULT false,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `users_id` PRIMARY KEY(`id`),
	CONSTRAINT `users_email_uq` UNIQUE(`email`)
);
--> statement-breakpoint
CREATE TABLE `outbox` (
	`id` int AUTO_INCREMENT NOT NULL,
	`to_address` varchar(254) NOT NULL,
	`subject` varchar(300) NOT NULL,
	`text_body` text NOT NULL,
	`html_body` text,
	`attachments` json,
	`status` enum('pending','sent','failed') NOT NULL DEFAULT 'pending',
	`attempts` int NOT NULL DEFAULT 0,
	`last_error` varchar(1000),
	`next_attempt_at` datetime(3) NOT NULL,
	`sent_at` datetime(3),
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `outbox_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `product_measurements` (
	`id` int AUTO_INCREMENT NOT NULL,
	`product_id` int NOT NULL,
	`abv_pct_vol` double NOT NULL,
	`residual_sugar_g_l` double NOT NULL,
	`lab` varchar(160) NOT NULL,
	`method` varchar(160) NOT NULL,
	`measured_on` date NOT NULL,
	`notes` text,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `product_measurements_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `products` (
	`id` int AUTO_INCREMENT NOT NULL,
	`venue_id` int NOT NULL,
	`code` varchar(40) NOT NULL,
	`kind` enum('still_wine','sparkling','fortified','spirit','beer','cider','other') NOT NULL,
	`name` varchar(160) NOT NULL,
	`producer` varchar(160) NOT NULL,
	`vintage_or_batch` varchar(40),
	`serving_temp_c` double NOT NULL,
	`allergens` json NOT NULL,
	`bottle_size_ml` int NOT NULL,
	`cost_per_bottle_minor` int NOT NULL,
	`status` enum('active','retired') NOT NULL DEFAULT 'active',
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `products_id` PRIMARY KEY(`id`),
	CONSTRAINT `products_venue_code_uq` UNIQUE(`venue_id`,`code`)
);
--> statement-breakpoint
ALTER TABLE `auth_tokens` ADD CONSTRAINT `auth_tokens_user_id_users_id_fk` FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `auth_tokens` ADD CONSTRAINT `auth_tokens_created_by_id_users_id_fk` FOREIGN KEY (`created_by_id`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `product_measurements` ADD CONSTRAINT `product_measurements_product_id_products_id_fk` FOREIGN KEY (`product_id`) REFERENCES `products`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `products` ADD CONSTRAINT `products_venue_id_venues_id_fk` FOREIGN KEY (`venue_id`) REFERENCES `venues`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `auth_tokens_user_idx` ON `auth_tokens` (`user_id`);--> statement-breakpoint
CREATE INDEX `outbox_due_idx` ON `outbox` (`status`,`next_attempt_at`);--> statement-breakpoint
CREATE INDEX `product_measurements_product_idx` ON `product_measurements` (`product_id`,`measured_on`);--> statement-breakpoint
CREATE INDEX `products_venue_status_idx` ON `products` (`venue_id`,`status`);