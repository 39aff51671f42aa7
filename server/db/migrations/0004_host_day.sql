CREATE TABLE `check_ins` (
	`id` int AUTO_INCREMENT NOT NULL,
	`booking_id` int NOT NULL,
	`host_id` int,
	`outcome` enum('arrived','turned_away','no_show') NOT NULL,
	`seated` int NOT NULL,
	`ids_seen` int NOT NULL,
	`reason` varchar(300),
	`recorded_at` datetime(3) NOT NULL,
	CONSTRAINT `check_ins_id` PRIMARY KEY(`id`),
	CONSTRAINT `check_ins_booking_uq` UNIQUE(`booking_id`)
);
--> statement-breakpoint
ALTER TABLE `bookings` ADD `notes` varchar(500);--> statement-breakpoint
ALTER TABLE `bookings` ADD `source` enum('online','walk_in') DEFAULT 'online' NOT NULL;--> statement-breakpoint
ALTER TABLE `check_ins` ADD CONSTRAINT `check_ins_booking_id_bookings_id_fk` FOREIGN KEY (`booking_id`) REFERENCES `bookings`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `check_ins` ADD CONSTRAINT `check_ins_host_id_users_id_fk` FOREIGN KEY (`host_id`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `check_ins_host_idx` ON `check_ins` (`host_id`);