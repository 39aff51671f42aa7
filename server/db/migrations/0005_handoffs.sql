CREATE TABLE `booking_events` (
	`id` int AUTO_INCREMENT NOT NULL,
	`booking_id` int NOT NULL,
	`event` enum('pay','late_payment','arrive','no_show','turn_away','undo_door','cancel','refund','expire') NOT NULL,
	`from_state` enum('held','confirmed','checked_in','no_show','cancelled','refunded','expired') NOT NULL,
	`to_state` enum('held','confirmed','checked_in','no_show','cancelled','refunded','expired') NOT NULL,
	`actor_id` int,
	`reason` varchar(300),
	`at` datetime(3) NOT NULL,
	CONSTRAINT `booking_events_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
ALTER TABLE `venues` ADD `locale` varchar(35) DEFAULT 'en-US' NOT NULL;--> statement-breakpoint
ALTER TABLE `venues` ADD `phone` varchar(40) DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE `venues` ADD `email` varchar(254) DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE `venues` ADD `website` varchar(300) DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE `venues` ADD `opening_hours` json;--> statement-breakpoint
ALTER TABLE `tasting_sessions` ADD CONSTRAINT `sessions_flight_start_uq` UNIQUE(`flight_id`,`starts_at`);--> statement-breakpoint
ALTER TABLE `booking_events` ADD CONSTRAINT `booking_events_booking_id_bookings_id_fk` FOREIGN KEY (`booking_id`) REFERENCES `bookings`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `booking_events` ADD CONSTRAINT `booking_events_actor_id_users_id_fk` FOREIGN KEY (`actor_id`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `booking_events_booking_idx` ON `booking_events` (`booking_id`,`at`);