CREATE TABLE `tools` (
	`id` int AUTO_INCREMENT NOT NULL,
	`shop_id` int NOT NULL,
	`name` varchar(80) NOT NULL,
	`kind` enum('surfacing','straight','spiral-up','spiral-down','compression','ball-nose','v-bit','other') NOT NULL,
	`diameter_mm` double NOT NULL,
	`flutes` int NOT NULL,
	`corner_radius_mm` double NOT NULL DEFAULT 0,
	`max_rpm` int NOT NULL,
	`notes` varchar(500),
	`created_at` timestamp(3) NOT NULL DEFAULT (now()),
	`updated_at` timestamp(3) NOT NULL DEFAULT (now()) ON UPDATE CURRENT_TIMESTAMP,
	CONSTRAINT `tools_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
ALTER TABLE `machines` ADD `dwell_unit` enum('seconds','milliseconds') DEFAULT 'seconds' NOT NULL;--> statement-breakpoint
ALTER TABLE `tools` ADD CONSTRAINT `tools_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `tools_shop_idx` ON `tools` (`shop_id`);