CREATE TABLE `audit_entries` (
	`id` int AUTO_INCREMENT NOT NULL,
	`shop_id` int NOT NULL,
	`actor_id` int,
	`kind` varchar(40) NOT NULL,
	`subject_type` varchar(40) NOT NULL,
	`subject_id` varchar(64) NOT NULL,
	`detail` json,
	`at` timestamp(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `audit_entries_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `machines` (
	`id` int AUTO_INCREMENT NOT NULL,
	`shop_id` int NOT NULL,
	`name` varchar(80) NOT NULL,
	`travel_x_mm` double NOT NULL,
	`travel_y_mm` double NOT NULL,
	`travel_z_mm` double NOT NULL,
	`units` enum('mm','in') NOT NULL DEFAULT 'mm',
	`spindle_kind` enum('trim-router','air-spindle','water-spindle') NOT NULL,
	`has_length_sensor` boolean NOT NULL DEFAULT false,
	`spoilboard_material` varchar(60) NOT NULL DEFAULT 'MDF',
	`spoilboard_nominal_mm` double NOT NULL,
	`spoilboard_min_mm` double NOT NULL,
	`accel_mm_s2` double NOT NULL DEFAULT 500,
	`rapid_mm_min` double NOT NULL DEFAULT 5000,
	`notes` text,
	`retired_at` timestamp(3),
	`created_at` timestamp(3) NOT NULL DEFAULT (now()),
	`updated_at` timestamp(3) NOT NULL DEFAULT (now()) ON UPDATE CURRENT_TIMESTAMP,
	CONSTRAINT `machines_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `maintenance_intervals` (
	`id` int AUTO_INCREMENT NOT NULL,
	`shop_id` int NOT NULL,
	`procedure_id` int NOT NULL,
	`machine_id` int,
	`every_days` int,
	`every_spindle_hours` double,
	`created_at` timestamp(3) NOT NULL DEFAULT (now()),
	CONSTRAINT `maintenance_intervals_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `procedure_steps` (
	`id` int AUTO_INCREMENT NOT NULL,
	`version_id` int NOT NULL,
	`position` int NOT NULL,
	`step_key` varchar(60) NOT NULL,
	`kind` enum('instruction','hold','check','photo','planner','signoff') NOT NULL,
	`title` varchar(160) NOT NULL,
	`body` text NOT NULL,
	`guidance` text,
	`settings` json,
	CONSTRAINT `procedure_steps_id` PRIMARY KEY(`id`),
	CONSTRAINT `procedure_steps_position_unique` UNIQUE(`version_id`,`position`)
);
--> statement-breakpoint
CREATE TABLE `procedure_versions` (
	`id` int AUTO_INCREMENT NOT NULL,
	`shop_id` int NOT NULL,
	`procedure_id` int NOT NULL,
	`version` int NOT NULL,
	`title` varchar(120) NOT NULL,
	`summary` text NOT NULL,
	`change_note` varchar(500),
	`created_by` int,
	`created_at` timestamp(3) NOT NULL DEFAULT (now()),
	CONSTRAINT `procedure_versions_id` PRIMARY KEY(`id`),
	CONSTRAINT `procedure_versions_unique` UNIQUE(`procedure_id`,`version`)
);
--> statement-breakpoint
CREATE TABLE `procedures` (
	`id` int AUTO_INCREMENT NOT NULL,
	`shop_id` int NOT NULL,
	`slug` varchar(80) NOT NULL,
	`category` varchar(40) NOT NULL,
	`current_version_id` int,
	`retired_at` timestamp(3),
	`created_at` timestamp(3) NOT NULL DEFAULT (now()),
	CONSTRAINT `procedures_id` PRIMARY KEY(`id`),
	CONSTRAINT `procedures_shop_slug_unique` UNIQUE(`shop_id`,`slug`)
);
--> statement-breakpoint
CREATE TABLE `qualifications` (
	`id` int AUTO_INCREMENT NOT NULL,
	`shop_id` int NOT NULL,
	`user_id` int NOT NULL,
	`procedure_id` int NOT NULL,
	`granted_by` int NOT NULL,
	`created_at` timestamp(3) NOT NULL DEFAULT (now()),
	CONSTRAINT `qualifications_id` PRIMARY KEY(`id`),
	CONSTRAINT `qualifications_unique` UNIQUE(`user_id`,`procedure_id`)
);
--> statement-breakpoint
CREATE TABLE `run_events` (
	`seq` int AUTO_INCREMENT NOT NULL,
	`id` varchar(36) NOT NULL,
	`shop_id` int NOT NULL,
	`run_id` varchar(36) NOT NULL,
	`type` varchar(40) NOT NULL,
	`actor_id` int NOT NULL,
	`device_id` varchar(64) NOT NULL,
	`at` timestamp(3) NOT NULL,
	`received_at` timestamp(3) NOT NULL DEFAULT (now()),
	`payload` json NOT NULL,
	`flag` varchar(60),
	CONSTRAINT `run_events_seq` PRIMARY KEY(`seq`),
	CONSTRAINT `run_events_id_unique` UNIQUE(`id`)
);
--> statement-breakpoint
CREATE TABLE `runs` (
	`id` varchar(36) NOT NULL,
	`shop_id` int NOT NULL,
	`machine_id` int NOT NULL,
	`procedure_version_id` int NOT NULL,
	`started_by` int NOT NULL,
	`mode` enum('guided','solo') NOT NULL,
	`status` enum('active','finished','abandoned') NOT NULL DEFAULT 'active',
	`current_step_key` varchar(60),
	`started_at` timestamp(3) NOT NULL,
	`finished_at` timestamp(3),
	`updated_at` timestamp(3) NOT NULL DEFAULT (now()) ON UPDATE CURRENT_TIMESTAMP,
	CONSTRAINT `runs_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `shops` (
	`id` int AUTO_INCREMENT NOT NULL,
	`name` varchar(120) NOT NULL,
	`units` enum('mm','in') NOT NULL DEFAULT 'mm',
	`created_at` timestamp(3) NOT NULL DEFAULT (now()),
	CONSTRAINT `shops_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `spoilboard_readings` (
	`id` int AUTO_INCREMENT NOT NULL,
	`shop_id` int NOT NULL,
	`machine_id` int NOT NULL,
	`taken_by` int NOT NULL,
	`taken_at` timestamp(3) NOT NULL,
	`kind` enum('height','thickness') NOT NULL,
	`grid` json NOT NULL,
	`spacing_x_mm` double NOT NULL,
	`spacing_y_mm` double NOT NULL,
	`run_id` varchar(36),
	`faced_depth_mm` double,
	`note` varchar(500),
	`created_at` timestamp(3) NOT NULL DEFAULT (now()),
	CONSTRAINT `spoilboard_readings_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `surfacing_plans` (
	`id` int AUTO_INCREMENT NOT NULL,
	`shop_id` int NOT NULL,
	`machine_id` int,
	`run_id` varchar(36),
	`created_by` int NOT NULL,
	`input` json NOT NULL,
	`summary` json NOT NULL,
	`created_at` timestamp(3) NOT NULL DEFAULT (now()),
	CONSTRAINT `surfacing_plans_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `uploads` (
	`id` varchar(36) NOT NULL,
	`shop_id` int NOT NULL,
	`run_id` varchar(36),
	`uploaded_by` int NOT NULL,
	`content_type` varchar(40) NOT NULL,
	`bytes` int NOT NULL,
	`storage_key` varchar(200) NOT NULL,
	`sha256` varchar(64) NOT NULL,
	`created_at` timestamp(3) NOT NULL DEFAULT (now()),
	CONSTRAINT `uploads_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `users` (
	`id` int AUTO_INCREMENT NOT NULL,
	`shop_id` int NOT NULL,
	`email` varchar(254) NOT NULL,
	`name` varchar(120) NOT NULL,
	`password_hash` varchar(255) NOT NULL,
	`pin_hash` varchar(255),
	`role` enum('owner','trainer','operator','trainee') NOT NULL,
	`units` enum('mm','in'),
	`active` boolean NOT NULL DEFAULT true,
	`created_at` timestamp(3) NOT NULL DEFAULT (now()),
	`updated_at` timestamp(3) NOT NULL DEFAULT (now()) ON UPDATE CURRENT_TIMESTAMP,
	CONSTRAINT `users_id` PRIMARY KEY(`id`),
	CONSTRAINT `users_email_unique` UNIQUE(`email`)
);
--> statement-breakpoint
ALTER TABLE `audit_entries` ADD CONSTRAINT `audit_entries_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `audit_entries` ADD CONSTRAINT `audit_entries_actor_id_users_id_fk` FOREIGN KEY (`actor_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `machines` ADD CONSTRAINT `machines_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `maintenance_intervals` ADD CONSTRAINT `maintenance_intervals_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `maintenance_intervals` ADD CONSTRAINT `maintenance_intervals_procedure_id_procedures_id_fk` FOREIGN KEY (`procedure_id`) REFERENCES `procedures`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `maintenance_intervals` ADD CONSTRAINT `maintenance_intervals_machine_id_machines_id_fk` FOREIGN KEY (`machine_id`) REFERENCES `machines`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `procedure_steps` ADD CONSTRAINT `procedure_steps_version_id_procedure_versions_id_fk` FOREIGN KEY (`version_id`) REFERENCES `procedure_versions`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `procedure_versions` ADD CONSTRAINT `procedure_versions_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `procedure_versions` ADD CONSTRAINT `procedure_versions_procedure_id_procedures_id_fk` FOREIGN KEY (`procedure_id`) REFERENCES `procedures`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `procedure_versions` ADD CONSTRAINT `procedure_versions_created_by_users_id_fk` FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `procedures` ADD CONSTRAINT `procedures_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `qualifications` ADD CONSTRAINT `qualifications_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `qualifications` ADD CONSTRAINT `qualifications_user_id_users_id_fk` FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `qualifications` ADD CONSTRAINT `qualifications_procedure_id_procedures_id_fk` FOREIGN KEY (`procedure_id`) REFERENCES `procedures`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `qualifications` ADD CONSTRAINT `qualifications_granted_by_users_id_fk` FOREIGN KEY (`granted_by`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `run_events` ADD CONSTRAINT `run_events_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `run_events` ADD CONSTRAINT `run_events_actor_id_users_id_fk` FOREIGN KEY (`actor_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `runs` ADD CONSTRAINT `runs_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `runs` ADD CONSTRAINT `runs_machine_id_machines_id_fk` FOREIGN KEY (`machine_id`) REFERENCES `machines`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `runs` ADD CONSTRAINT `runs_procedure_version_id_procedure_versions_id_fk` FOREIGN KEY (`procedure_version_id`) REFERENCES `procedure_versions`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `runs` ADD CONSTRAINT `runs_started_by_users_id_fk` FOREIGN KEY (`started_by`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `spoilboard_readings` ADD CONSTRAINT `spoilboard_readings_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `spoilboard_readings` ADD CONSTRAINT `spoilboard_readings_machine_id_machines_id_fk` FOREIGN KEY (`machine_id`) REFERENCES `machines`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `spoilboard_readings` ADD CONSTRAINT `spoilboard_readings_taken_by_users_id_fk` FOREIGN KEY (`taken_by`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `surfacing_plans` ADD CONSTRAINT `surfacing_plans_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `surfacing_plans` ADD CONSTRAINT `surfacing_plans_machine_id_machines_id_fk` FOREIGN KEY (`machine_id`) REFERENCES `machines`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `surfacing_plans` ADD CONSTRAINT `surfacing_plans_created_by_users_id_fk` FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `uploads` ADD CONSTRAINT `uploads_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `uploads` ADD CONSTRAINT `uploads_uploaded_by_users_id_fk` FOREIGN KEY (`uploaded_by`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `users` ADD CONSTRAINT `users_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `audit_entries_shop_at_idx` ON `audit_entries` (`shop_id`,`at`);--> statement-breakpoint
CREATE INDEX `audit_entries_shop_kind_idx` ON `audit_entries` (`shop_id`,`kind`,`at`);--> statement-breakpoint
CREATE INDEX `machines_shop_idx` ON `machines` (`shop_id`);--> statement-breakpoint
CREATE INDEX `maintenance_intervals_shop_idx` ON `maintenance_intervals` (`shop_id`);--> statement-breakpoint
CREATE INDEX `run_events_run_idx` ON `run_events` (`run_id`,`seq`);--> statement-breakpoint
CREATE INDEX `run_events_shop_at_idx` ON `run_events` (`shop_id`,`at`);--> statement-breakpoint
CREATE INDEX `run_events_shop_type_idx` ON `run_events` (`shop_id`,`type`,`at`);--> statement-breakpoint
CREATE INDEX `run_events_shop_flag_idx` ON `run_events` (`shop_id`,`flag`);--> statement-breakpoint
CREATE INDEX `runs_shop_status_idx` ON `runs` (`shop_id`,`status`);--> statement-breakpoint
CREATE INDEX `runs_machine_idx` ON `runs` (`machine_id`,`started_at`);--> statement-breakpoint
CREATE INDEX `spoilboard_readings_machine_idx` ON `spoilboard_readings` (`machine_id`,`taken_at`);--> statement-breakpoint
CREATE INDEX `surfacing_plans_run_idx` ON `surfacing_plans` (`run_id`);--> statement-breakpoint
CREATE INDEX `uploads_shop_run_idx` ON `uploads` (`shop_id`,`run_id`);--> statement-breakpoint
CREATE INDEX `users_shop_idx` ON `users` (`shop_id`);