ALTER TABLE `organisations` ADD `settings_version` integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE `users` ADD `last_sign_in_at` text;