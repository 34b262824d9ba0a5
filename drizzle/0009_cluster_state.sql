CREATE TABLE `revoked_sessions` (
	`session_id` varchar(64) NOT NULL,
	`until` timestamp(3) NOT NULL,
	CONSTRAINT `revoked_sessions_session_id` PRIMARY KEY(`session_id`)
);
--> statement-breakpoint
CREATE TABLE `run_merges` (
	`run_id` varchar(36) NOT NULL,
	`merges` int NOT NULL DEFAULT 0,
	CONSTRAINT `run_merges_run_id` PRIMARY KEY(`run_id`)
);
--> statement-breakpoint
CREATE TABLE `worker_leases` (
	`name` varchar(64) NOT NULL,
	`holder` varchar(96) NOT NULL,
	`expires_at` timestamp(3) NOT NULL,
	`done_for` varchar(32),
	CONSTRAINT `worker_leases_name` PRIMARY KEY(`name`)
);
--> statement-breakpoint
CREATE INDEX `revoked_sessions_until_idx` ON `revoked_sessions` (`until`);--> statement-breakpoint
CREATE TRIGGER `run_events_mark_run_merge` AFTER INSERT ON `run_events` FOR EACH ROW INSERT INTO `run_merges` (`run_id`, `merges`) VALUES (NEW.`run_id`, 1) ON DUPLICATE KEY UPDATE `merges` = `merges` + 1;