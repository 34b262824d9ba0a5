ALTER TABLE `ledger_entries` MODIFY COLUMN `kind` enum('override','late-past-hold','out-of-range','skipped-check','hold-acknowledged','signed-off','entry-changed','backdated','signoff-failed','entered-from-paper') NOT NULL;--> statement-breakpoint
ALTER TABLE `runs` ADD `origin` enum('tablet','paper') DEFAULT 'tablet' NOT NULL;--> statement-breakpoint
ALTER TABLE `runs` ADD `entered_by` int;--> statement-breakpoint
ALTER TABLE `runs` ADD `entered_at` timestamp(3);--> statement-breakpoint
ALTER TABLE `runs` ADD `sheet_upload_id` varchar(64);--> statement-breakpoint
ALTER TABLE `shops` ADD `paper_size` enum('a4','letter') DEFAULT 'a4' NOT NULL;--> statement-breakpoint
ALTER TABLE `runs` ADD CONSTRAINT `runs_entered_by_users_id_fk` FOREIGN KEY (`entered_by`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;