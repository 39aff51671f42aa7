ALTER TABLE `products` MODIFY COLUMN `kind` enum('still_wine','sparkling','fortified','spirit','beer','cider','low_alcohol','other') NOT NULL;--> statement-breakpoint
ALTER TABLE `venues` ADD `room_humidity_pct` int DEFAULT 50 NOT NULL;--> statement-breakpoint
ALTER TABLE `venues` ADD `room_air_temp_c` decimal(4,1) DEFAULT 21 NOT NULL;--> statement-breakpoint
ALTER TABLE `tasting_sessions` ADD `room_humidity_pct` int;--> statement-breakpoint
ALTER TABLE `tasting_sessions` ADD `room_air_temp_c` decimal(4,1);--> statement-breakpoint
ALTER TABLE `tasting_sessions` ADD `room_read_at` datetime(3);--> statement-breakpoint
ALTER TABLE `tasting_sessions` ADD `room_read_by` int;--> statement-breakpoint
ALTER TABLE `tasting_sessions` ADD CONSTRAINT `tasting_sessions_room_read_by_users_id_fk` FOREIGN KEY (`room_read_by`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;