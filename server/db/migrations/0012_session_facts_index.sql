CREATE INDEX `bookings_session_facts_idx` ON `bookings` (`session_id`,`state`,`source`,`hold_expires_at`,`party_size`,`amount_paid_minor`,`amount_refunded_minor`);--> statement-breakpoint
DROP INDEX `bookings_session_state_idx` ON `bookings`;
