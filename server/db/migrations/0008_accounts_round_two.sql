CREATE TABLE `signed_out_sessions` (
	`session_id` char(22) NOT NULL,
	`user_id` int NOT NULL,
	`expires_at` datetime(3) NOT NULL,
	CONSTRAINT `signed_out_sessions_session_id` PRIMARY KEY(`session_id`)
);
--> statement-breakpoint
ALTER TABLE `auth_tokens` MODIFY COLUMN `purpose` enum('invite','reset','verify') NOT NULL;--> statement-breakpoint
ALTER TABLE `users` ADD `session_version` int DEFAULT 1 NOT NULL;--> statement-breakpoint
ALTER TABLE `users` ADD `email_verified_at` datetime(3);--> statement-breakpoint
ALTER TABLE `signed_out_sessions` ADD CONSTRAINT `signed_out_sessions_user_id_users_id_fk` FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `signed_out_sessions_expires_idx` ON `signed_out_sessions` (`expires_at`);--> statement-breakpoint
-- Accounts that existed before address checks count as checked, so that an upgrade locks nobody out.
UPDATE `users` SET `email_verified_at` = `created_at` WHERE `email_verified_at` IS NULL;