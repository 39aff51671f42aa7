CREATE TABLE `observations` (
	`id` int AUTO_INCREMENT NOT NULL,
	`venue_id` int NOT NULL,
	`flight_id` int NOT NULL,
	`flight_pour_id` int NOT NULL,
	`product_id` int NOT NULL,
	`measurement_id` int NOT NULL,
	`glass_id` int NOT NULL,
	`session_id` int,
	`source` enum('guest','host') NOT NULL,
	`device_key` char(64),
	`abv_pct_vol` double NOT NULL,
	`residual_sugar_g_l` double NOT NULL,
	`serving_temp_c` double NOT NULL,
	`band_height_mm` double,
	`no_clear_band` boolean NOT NULL DEFAULT false,
	`tears_formed` enum('yes','no','unsure') NOT NULL,
	`tear_count` enum('up_to_5','6_to_15','16_to_30','over_30'),
	`tear_speed` enum('slow','steady','fast'),
	`minutes_since` int NOT NULL,
	`since` enum('pour','swirl') NOT NULL,
	`room_humidity_pct` int NOT NULL,
	`room_air_temp_c` decimal(4,1) NOT NULL,
	`room_source` enum('host','session','venue') NOT NULL,
	`flags` json NOT NULL,
	`demo` boolean NOT NULL DEFAULT false,
	`recorded_at` datetime(3) NOT NULL,
	CONSTRAINT `observations_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
ALTER TABLE `venues` ADD `calibration_enabled` boolean DEFAULT true NOT NULL;--> statement-breakpoint
ALTER TABLE `observations` ADD CONSTRAINT `observations_venue_id_venues_id_fk` FOREIGN KEY (`venue_id`) REFERENCES `venues`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `observations` ADD CONSTRAINT `observations_flight_id_flights_id_fk` FOREIGN KEY (`flight_id`) REFERENCES `flights`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `observations` ADD CONSTRAINT `observations_flight_pour_id_flight_pours_id_fk` FOREIGN KEY (`flight_pour_id`) REFERENCES `flight_pours`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `observations` ADD CONSTRAINT `observations_product_id_products_id_fk` FOREIGN KEY (`product_id`) REFERENCES `products`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `observations` ADD CONSTRAINT `observations_measurement_id_product_measurements_id_fk` FOREIGN KEY (`measurement_id`) REFERENCES `product_measurements`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `observations` ADD CONSTRAINT `observations_glass_id_glasses_id_fk` FOREIGN KEY (`glass_id`) REFERENCES `glasses`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `observations` ADD CONSTRAINT `observations_session_id_tasting_sessions_id_fk` FOREIGN KEY (`session_id`) REFERENCES `tasting_sessions`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `observations_venue_time_idx` ON `observations` (`venue_id`,`recorded_at`);--> statement-breakpoint
CREATE INDEX `observations_pour_idx` ON `observations` (`flight_pour_id`,`session_id`,`device_key`);--> statement-breakpoint
CREATE INDEX `observations_product_idx` ON `observations` (`product_id`);--> statement-breakpoint
CREATE INDEX `observations_glass_idx` ON `observations` (`glass_id`);