CREATE TABLE `sign_off_amendments` (
	`id` text PRIMARY KEY NOT NULL,
	`sign_off_id` text NOT NULL,
	`tank_id` text NOT NULL,
	`amended_by` text,
	`amended_at` text NOT NULL,
	`reason` text NOT NULL,
	`changes` text NOT NULL,
	FOREIGN KEY (`sign_off_id`) REFERENCES `sign_offs`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`tank_id`) REFERENCES `tanks`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`amended_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `sign_off_amendments_sign_off_idx` ON `sign_off_amendments` (`sign_off_id`);