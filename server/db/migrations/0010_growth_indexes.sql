CREATE INDEX `outbox_status_created_idx` ON `outbox` (`status`,`created_at`);--> statement-breakpoint
CREATE INDEX `bookings_venue_created_idx` ON `bookings` (`venue_id`,`created_at`);