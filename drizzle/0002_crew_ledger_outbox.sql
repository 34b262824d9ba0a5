CREATE TABLE `invites` (
	`id` int AUTO_INCREMENT NOT NULL,
	`shop_id` int NOT NULL,
	`email` varchar(254) NOT NULL,
	`role` enum('owner','trainer','operator','trainee') NOT NULL,
	`token_hash` varchar(64) NOT NULL,
	`invited_by` int NOT NULL,
	`expires_at` timestamp(3) NOT NULL,
	`accepted_at` timestamp(3),
	`accepted_user_id` int,
	`revoked_at` timestamp(3),
	`created_at` timestamp(3) NOT NULL DEFAULT (now()),
	CONSTRAINT `invites_id` PRIMARY KEY(`id`),
	CONSTRAINT `invites_token_unique` UNIQUE(`token_hash`)
);
--> statement-breakpoint
CREATE TABLE `ledger_entries` (
	`id` int AUTO_INCREMENT NOT NULL,
	`shop_id` int NOT NULL,
	`event_id` varchar(36) NOT NULL,
	`run_id` varchar(36) NOT NULL,
	`kind` enum('override','late-past-hold','out-of-range','skipped-check') NOT NULL,
	`actor_id` int NOT NULL,
	`machine_id` int NOT NULL,
	`procedure_id` int NOT NULL,
	`step_key` varchar(60),
	`at` timestamp(3) NOT NULL,
	`detail` json NOT NULL,
	CONSTRAINT `ledger_entries_id` PRIMARY KEY(`id`),
	CONSTRAINT `ledger_entries_event_kind_unique` UNIQUE(`event_id`,`kind`)
);
--> statement-breakpoint
CREATE TABLE `mail_outbox` (
	`id` int AUTO_INCREMENT NOT NULL,
	`shop_id` int,
	`kind` varchar(40) NOT NULL,
	`dedupe_key` varchar(160) NOT NULL,
	`to_address` varchar(254) NOT NULL,
	`subject` varchar(200) NOT NULL,
	`text_body` text NOT NULL,
	`html_body` text,
	`status` enum('waiting','sent','failed') NOT NULL DEFAULT 'waiting',
	`attempts` int NOT NULL DEFAULT 0,
	`next_attempt_at` timestamp(3) NOT NULL DEFAULT (now()),
	`last_error` varchar(500),
	`message_id` varchar(200),
	`sent_at` timestamp(3),
	`created_at` timestamp(3) NOT NULL DEFAULT (now()),
	CONSTRAINT `mail_outbox_id` PRIMARY KEY(`id`),
	CONSTRAINT `mail_outbox_dedupe_unique` UNIQUE(`dedupe_key`)
);
--> statement-breakpoint
CREATE TABLE `sign_in_failures` (
	`id` int AUTO_INCREMENT NOT NULL,
	`email` varchar(254) NOT NULL,
	`address` varchar(64) NOT NULL,
	`at` timestamp(3) NOT NULL DEFAULT (now()),
	CONSTRAINT `sign_in_failures_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
ALTER TABLE `runs` ADD `spindle_minutes` double DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE `invites` ADD CONSTRAINT `invites_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `invites` ADD CONSTRAINT `invites_invited_by_users_id_fk` FOREIGN KEY (`invited_by`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `invites` ADD CONSTRAINT `invites_accepted_user_id_users_id_fk` FOREIGN KEY (`accepted_user_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `ledger_entries` ADD CONSTRAINT `ledger_entries_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `ledger_entries` ADD CONSTRAINT `ledger_entries_actor_id_users_id_fk` FOREIGN KEY (`actor_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `ledger_entries` ADD CONSTRAINT `ledger_entries_machine_id_machines_id_fk` FOREIGN KEY (`machine_id`) REFERENCES `machines`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `ledger_entries` ADD CONSTRAINT `ledger_entries_procedure_id_procedures_id_fk` FOREIGN KEY (`procedure_id`) REFERENCES `procedures`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `mail_outbox` ADD CONSTRAINT `mail_outbox_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `invites_shop_idx` ON `invites` (`shop_id`,`created_at`);--> statement-breakpoint
CREATE INDEX `ledger_entries_shop_at_idx` ON `ledger_entries` (`shop_id`,`at`);--> statement-breakpoint
CREATE INDEX `ledger_entries_shop_kind_idx` ON `ledger_entries` (`shop_id`,`kind`,`at`);--> statement-breakpoint
CREATE INDEX `ledger_entries_shop_actor_idx` ON `ledger_entries` (`shop_id`,`actor_id`,`at`);--> statement-breakpoint
CREATE INDEX `ledger_entries_shop_machine_idx` ON `ledger_entries` (`shop_id`,`machine_id`,`at`);--> statement-breakpoint
CREATE INDEX `ledger_entries_shop_procedure_idx` ON `ledger_entries` (`shop_id`,`procedure_id`,`at`);--> statement-breakpoint
CREATE INDEX `mail_outbox_due_idx` ON `mail_outbox` (`status`,`next_attempt_at`);--> statement-breakpoint
CREATE INDEX `sign_in_failures_email_idx` ON `sign_in_failures` (`email`,`at`);--> statement-breakpoint
CREATE INDEX `sign_in_failures_address_idx` ON `sign_in_failures` (`address`,`at`);