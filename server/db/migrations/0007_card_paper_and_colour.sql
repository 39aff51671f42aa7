ALTER TABLE `venues` ADD `country` char(2) DEFAULT 'US' NOT NULL;--> statement-breakpoint
ALTER TABLE `venues` ADD `card_paper` enum('a5','half-letter');--> statement-breakpoint
ALTER TABLE `products` ADD `colour` enum('water_white','pale_straw','straw','gold','deep_gold','amber','copper','mahogany','pale_pink','salmon','ruby','garnet','deep_garnet','tawny','brown','black');--> statement-breakpoint
UPDATE `venues` SET `country` = UPPER(SUBSTRING(`locale`, LOCATE('-', `locale`) + 1, 2)) WHERE `locale` REGEXP '^[a-zA-Z]{2,3}-[a-zA-Z]{2}(-|$)';
