CREATE TABLE `throttle_marks` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`key` text NOT NULL,
	`at` text NOT NULL
);
--> statement-breakpoint
CREATE INDEX `throttle_marks_key_at` ON `throttle_marks` (`key`,`at`);--> statement-breakpoint
DROP TABLE `sign_in_failures`;