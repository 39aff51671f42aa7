CREATE TABLE `content_docs` (
	`id` int AUTO_INCREMENT NOT NULL,
	`venue_id` int NOT NULL,
	`kind` enum('product_note','flight_intro','article') NOT NULL,
	`subject_id` int,
	`slug` varchar(80),
	`title` varchar(200) NOT NULL DEFAULT '',
	`draft_body` mediumtext NOT NULL,
	`published_body` mediumtext,
	`published_title` varchar(200),
	`status` enum('draft','published') NOT NULL DEFAULT 'draft',
	`published_at` datetime(3),
	`updated_by_id` int,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `content_docs_id` PRIMARY KEY(`id`),
	CONSTRAINT `content_docs_subject_uq` UNIQUE(`venue_id`,`kind`,`subject_id`),
	CONSTRAINT `content_docs_slug_uq` UNIQUE(`venue_id`,`slug`)
);
--> statement-breakpoint
CREATE TABLE `content_revisions` (
	`id` int AUTO_INCREMENT NOT NULL,
	`doc_id` int NOT NULL,
	`action` enum('save','publish','unpublish','restore') NOT NULL,
	`title` varchar(200) NOT NULL DEFAULT '',
	`body` mediumtext NOT NULL,
	`author_id` int,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `content_revisions_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `images` (
	`id` int AUTO_INCREMENT NOT NULL,
	`venue_id` int NOT NULL,
	`product_id` int,
	`role` enum('photo','label') NOT NULL,
	`stored_name` varchar(80) NOT NULL,
	`mime_type` varchar(40) NOT NULL,
	`bytes` int NOT NULL,
	`width` int NOT NULL,
	`height` int NOT NULL,
	`alt_text` varchar(300) NOT NULL DEFAULT '',
	`uploaded_by_id` int,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `images_id` PRIMARY KEY(`id`),
	CONSTRAINT `images_stored_name_uq` UNIQUE(`stored_name`)
);
--> statement-breakpoint
ALTER TABLE `content_docs` ADD CONSTRAINT `content_docs_venue_id_venues_id_fk` FOREIGN KEY (`venue_id`) REFERENCES `venues`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `content_docs` ADD CONSTRAINT `content_docs_updated_by_id_users_id_fk` FOREIGN KEY (`updated_by_id`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `content_revisions` ADD CONSTRAINT `content_revisions_doc_id_content_docs_id_fk` FOREIGN KEY (`doc_id`) REFERENCES `content_docs`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `content_revisions` ADD CONSTRAINT `content_revisions_author_id_users_id_fk` FOREIGN KEY (`author_id`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `images` ADD CONSTRAINT `images_venue_id_venues_id_fk` FOREIGN KEY (`venue_id`) REFERENCES `venues`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `images` ADD CONSTRAINT `images_product_id_products_id_fk` FOREIGN KEY (`product_id`) REFERENCES `products`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `images` ADD CONSTRAINT `images_uploaded_by_id_users_id_fk` FOREIGN KEY (`uploaded_by_id`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `content_revisions_doc_idx` ON `content_revisions` (`doc_id`,`id`);--> statement-breakpoint
CREATE INDEX `images_product_idx` ON `images` (`product_id`);