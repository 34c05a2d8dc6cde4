CREATE TABLE `salinity_instruments` (
	`user_id` text NOT NULL,
	`tank_id` text NOT NULL,
	`mode` text NOT NULL,
	`sg_basis` text NOT NULL,
	`created_at` text NOT NULL,
	`updated_at` text NOT NULL,
	PRIMARY KEY(`user_id`, `tank_id`),
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`tank_id`) REFERENCES `tanks`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `salinity_instruments_tank_idx` ON `salinity_instruments` (`tank_id`);