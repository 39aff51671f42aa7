CREATE TABLE `flight_pours` (
	`id` int AUTO_INCREMENT NOT NULL,
	`flight_id` int NOT NULL,
	`position` int NOT NULL,
	`product_id` int NOT NULL,
	`volume_ml` double NOT NULL,
	`glass_id` int NOT NULL,
	`serving_temp_c` double NOT NULL,
	`note` text,
	CONSTRAINT `flight_pours_id` PRIMARY KEY(`id`),
	CONSTRAINT `flight_pours_position_uq` UNIQUE(`flight_id`,`position`)
);
--> statement-breakpoint
CREATE TABLE `flights` (
	`id` int AUTO_INCREMENT NOT NULL,
	`venue_id` int NOT NULL,
	`lineage_id` int,
	`version` int NOT NULL DEFAULT 1,
	`name` varchar(120) NOT NULL,
	`summary` varchar(400) NOT NULL DEFAULT '',
	`status` enum('draft','published','retired') NOT NULL DEFAULT 'draft',
	`published_at` datetime(3),
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `flights_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `glasses` (
	`id` int AUTO_INCREMENT NOT NULL,
	`venue_id` int NOT NULL,
	`name` varchar(80) NOT NULL,
	`bowl_diameter_mm` double NOT NULL,
	`wall_angle_deg` double NOT NULL,
	`fill_height_mm` double NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `glasses_id` PRIMARY KEY(`id`),
	CONSTRAINT `glasses_venue_name_uq` UNIQUE(`venue_id`,`name`)
);
--> statement-breakpoint
CREATE TABLE `tasting_sessions` (
	`id` int AUTO_INCREMENT NOT NULL,
	`venue_id` int NOT NULL,
	`flight_id` int NOT NULL,
	`starts_at` datetime(3) NOT NULL,
	`duration_minutes` int NOT NULL,
	`seats` int NOT NULL,
	`price_minor` int NOT NULL,
	`currency` char(3) NOT NULL,
	`host_id` int,
	`booking_cutoff_minutes` int NOT NULL DEFAULT 60,
	`status` enum('open','closed','cancelled') NOT NULL DEFAULT 'open',
	`series_id` varchar(36),
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `tasting_sessions_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
ALTER TABLE `flight_pours` ADD CONSTRAINT `flight_pours_flight_id_flights_id_fk` FOREIGN KEY (`flight_id`) REFERENCES `flights`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `flight_pours` ADD CONSTRAINT `flight_pours_product_id_products_id_fk` FOREIGN KEY (`product_id`) REFERENCES `products`(`id`) ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `flight_pours` ADD CONSTRAINT `flight_pours_glass_id_glasses_id_fk` FOREIGN KEY (`glass_id`) REFERENCES `glasses`(`id`) ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `flights` ADD CONSTRAINT `flights_venue_id_venues_id_fk` FOREIGN KEY (`venue_id`) REFERENCES `venues`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `glasses` ADD CONSTRAINT `glasses_venue_id_venues_id_fk` FOREIGN KEY (`venue_id`) REFERENCES `venues`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `tasting_sessions` ADD CONSTRAINT `tasting_sessions_venue_id_venues_id_fk` FOREIGN KEY (`venue_id`) REFERENCES `venues`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `tasting_sessions` ADD CONSTRAINT `tasting_sessions_flight_id_flights_id_fk` FOREIGN KEY (`flight_id`) REFERENCES `flights`(`id`) ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `tasting_sessions` ADD CONSTRAINT `tasting_sessions_host_id_users_id_fk` FOREIGN KEY (`host_id`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `flights_venue_status_idx` ON `flights` (`venue_id`,`status`);--> statement-breakpoint
CREATE INDEX `flights_lineage_idx` ON `flights` (`lineage_id`);--> statement-breakpoint
CREATE INDEX `sessions_venue_start_idx` ON `tasting_sessions` (`venue_id`,`starts_at`);--> statement-breakpoint
CREATE INDEX `sessions_flight_idx` ON `tasting_sessions` (`flight_id`);--> statement-breakpoint
CREATE INDEX `sessions_series_idx` ON `tasting_sessions` (`series_id`);