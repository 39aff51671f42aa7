CREATE INDEX `sessions_start_idx` ON `tasting_sessions` (`starts_at`);--> statement-breakpoint
CREATE INDEX `bookings_refund_due_idx` ON `bookings` (`state`,`refunded_at`,`payment_intent_id`);