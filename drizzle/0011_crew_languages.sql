ALTER TABLE `procedure_versions` ADD `translations` json;--> statement-breakpoint
ALTER TABLE `users` ADD `language` varchar(12);