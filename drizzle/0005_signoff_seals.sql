CREATE TABLE `signoff_keys` (
	`id` int NOT NULL,
	`key_id` varchar(32) NOT NULL,
	`public_spki` text NOT NULL,
	`private_pkcs8` text NOT NULL,
	`created_at` timestamp(3) NOT NULL DEFAULT (now()),
	CONSTRAINT `signoff_keys_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `signoff_nonces` (
	`nonce` varchar(64) NOT NULL,
	`shop_id` int NOT NULL,
	`event_id` varchar(36) NOT NULL,
	`signer_id` int NOT NULL,
	`created_at` timestamp(3) NOT NULL DEFAULT (now()),
	CONSTRAINT `signoff_nonces_nonce` PRIMARY KEY(`nonce`)
);
--> statement-breakpoint
ALTER TABLE `ledger_entries` MODIFY COLUMN `kind` enum('override','late-past-hold','out-of-range','skipped-check','signoff-failed') NOT NULL;--> statement-breakpoint
ALTER TABLE `signoff_nonces` ADD CONSTRAINT `signoff_nonces_shop_id_shops_id_fk` FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `signoff_nonces` ADD CONSTRAINT `signoff_nonces_signer_id_users_id_fk` FOREIGN KEY (`signer_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;