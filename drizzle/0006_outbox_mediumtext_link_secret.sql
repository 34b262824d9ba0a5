ALTER TABLE `mail_outbox` MODIFY COLUMN `text_body` mediumtext NOT NULL;--> statement-breakpoint
ALTER TABLE `mail_outbox` MODIFY COLUMN `html_body` mediumtext;--> statement-breakpoint
ALTER TABLE `mail_outbox` ADD `link_secret` varchar(300);