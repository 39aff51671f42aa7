CREATE TABLE `bookings` (
	`id` int AUTO_INCREMENT NOT NULL,
	`venue_id` int NOT NULL,
	`session_id` int NOT NULL,
	`user_id` int NOT NULL,
	`reference` char(10) NOT NULL,
	`state` enum('held','confirmed','checked_in','no_show','cancelled','refunded','expired') NOT NULL,
	`party_size` int NOT NULL,
	`contact_name` varchar(120) NOT NULL,
	`contact_email` varchar(254) NOT NULL,
	`contact_phone` varchar(30) NOT NULL,
	`age_confirmed` boolean NOT NULL,
	`unit_price_minor` int NOT NULL,
	`amount_minor` int NOT NULL,
	`currency` char(3) NOT NULL,
	`hold_expires_at` datetime(3) NOT NULL,
	`checkout_session_id` varchar(255),
	`checkout_url` varchar(1000),
	`payment_intent_id` varchar(255),
	`amount_paid_minor` int NOT NULL DEFAULT 0,
	`amount_refunded_minor` int NOT NULL DEFAULT 0,
	`refund_id` varchar(255),
	`end_reason` enum('guest_cancelled','session_cancelled','hold_released','hold_expired','checkout_failed','late_payment_no_seats'),
	`confirmed_at` datetime(3),
	`cancelled_at` datetime(3),
	`refunded_at` datetime(3),
	`expired_at` datetime(3),
	`checked_in_at` datetime(3),
	`reminder_sent_at` datetime(3),
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `bookings_id` PRIMARY KEY(`id`),
	CONSTRAINT `bookings_reference_uq` UNIQUE(`reference`),
	CONSTRAINT `bookings_checkout_session_uq` UNIQUE(`checkout_session_id`)
);
--> statement-breakpoint
CREATE TABLE `payment_events` (
	`id` int AUTO_INCREMENT NOT NULL,
	`provider` varchar(20) NOT NULL,
	`provider_event_id` varchar(255) NOT NULL,
	`type` varchar(100) NOT NULL,
	`payload_hash` char(64) NOT NULL,
	`booking_id` int,
	`outcome` varchar(200) NOT NULL,
	`processed_at` datetime(3) NOT NULL,
	CONSTRAINT `payment_events_id` PRIMARY KEY(`id`),
	CONSTRAINT `payment_events_provider_event_uq` UNIQUE(`provider`,`provider_event_id`)
);
--> statement-breakpoint
ALTER TABLE `bookings` ADD CONSTRAINT `bookings_venue_id_venues_id_fk` FOREIGN KEY (`venue_id`) REFERENCES `venues`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `bookings` ADD CONSTRAINT `bookings_session_id_tasting_sessions_id_fk` FOREIGN KEY (`session_id`) REFERENCES `tasting_sessions`(`id`) ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `bookings` ADD CONSTRAINT `bookings_user_id_users_id_fk` FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `payment_events` ADD CONSTRAINT `payment_events_booking_id_bookings_id_fk` FOREIGN KEY (`booking_id`) REFERENCES `bookings`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `bookings_session_state_idx` ON `bookings` (`session_id`,`state`);--> statement-breakpoint
CREATE INDEX `bookings_user_idx` ON `bookings` (`user_id`);--> statement-breakpoint
CREATE INDEX `bookings_state_hold_idx` ON `bookings` (`state`,`hold_expires_at`);--> statement-breakpoint
CREATE INDEX `payment_events_booking_idx` ON `payment_events` (`booking_id`);