CREATE TABLE `spoilboard_facings` (
	`id` int AUTO_INCREMENT NOT NULL,
	`shop_id` int NOT NULL,
	`machine_id` int NOT NULL,
	`run_id` varchar(36) NOT NULL,
	`depth_mm` double,
	`thickness_mm` double,
	`faced_at` timestamp(3) NOT NULL,
	`created_at` timestamp(3) NOT NULL DEFAULT (now()),
	CONSTRAINT `spoilboard_facings_id` PRIMARY KEY(`id`),
	CONSTRAINT `spoilboard_facings_run_unique` UNIQUE(`run_id`)
);
--> statement-breakpoint
ALTER TABLE `spoilboard_facings` ADD CONSTRAINT `spoilboard_facings_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `spoilboard_facings` ADD CONSTRAINT `spoilboard_facings_machine_id_machines_id_fk` FOREIGN KEY (`machine_id`) REFERENCES `machines`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `spoilboard_facings_machine_idx` ON `spoilboard_facings` (`machine_id`,`faced_at`);