ALTER TABLE `ledger_entries` DROP INDEX `ledger_entries_event_kind_unique`;--> statement-breakpoint
ALTER TABLE `ledger_entries` MODIFY COLUMN `kind` enum('override','late-past-hold','out-of-range','skipped-check','hold-acknowledged','signed-off','entry-changed','backdated','signoff-failed') NOT NULL;--> statement-breakpoint
ALTER TABLE `ledger_entries` ADD `received_at` timestamp(3);--> statement-breakpoint
ALTER TABLE `ledger_entries` ADD `recorded_at` timestamp(3) DEFAULT (now()) NOT NULL;--> statement-breakpoint
ALTER TABLE `ledger_entries` ADD `entry_key` varchar(100);--> statement-breakpoint
ALTER TABLE `ledger_entries` ADD `revision` int DEFAULT 1 NOT NULL;--> statement-breakpoint
ALTER TABLE `ledger_entries` ADD `counted` boolean DEFAULT true NOT NULL;--> statement-breakpoint
ALTER TABLE `ledger_entries` ADD `changed_at` timestamp(3);--> statement-breakpoint
ALTER TABLE `ledger_entries` ADD `changed_by` int;--> statement-breakpoint
UPDATE `ledger_entries` SET `entry_key` = CONCAT(`event_id`, ':', `kind`, ':1'), `recorded_at` = `at`;--> statement-breakpoint
UPDATE `ledger_entries` `l` JOIN `run_events` `e` ON `e`.`id` = `l`.`event_id` SET `l`.`received_at` = `e`.`received_at`;--> statement-breakpoint
ALTER TABLE `ledger_entries` ADD CONSTRAINT `ledger_entries_entry_key_unique` UNIQUE(`entry_key`);--> statement-breakpoint
CREATE INDEX `ledger_entries_run_idx` ON `ledger_entries` (`run_id`);