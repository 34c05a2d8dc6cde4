CREATE TABLE `audit_log` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`organisation_id` text NOT NULL,
	`actor_id` text,
	`action` text NOT NULL,
	`entity` text NOT NULL,
	`entity_id` text,
	`before` text,
	`after` text,
	`at` text NOT NULL
);
--> statement-breakpoint
CREATE INDEX `audit_org_at` ON `audit_log` (`organisation_id`,`at`);--> statement-breakpoint
CREATE TABLE `clients` (
	`id` text PRIMARY KEY NOT NULL,
	`organisation_id` text NOT NULL,
	`name` text NOT NULL,
	`email` text,
	`phone` text,
	`notes` text,
	`archived_at` text,
	`created_at` text NOT NULL,
	`updated_at` text NOT NULL,
	FOREIGN KEY (`organisation_id`) REFERENCES `organisations`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `clients_org_idx` ON `clients` (`organisation_id`);--> statement-breakpoint
CREATE TABLE `events` (
	`id` text PRIMARY KEY NOT NULL,
	`tank_id` text NOT NULL,
	`at` text NOT NULL,
	`kind` text NOT NULL,
	`amount` real,
	`group` text,
	`notes` text,
	`entered_by` text,
	`created_at` text NOT NULL,
	`updated_at` text NOT NULL,
	FOREIGN KEY (`tank_id`) REFERENCES `tanks`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`entered_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `events_tank_at` ON `events` (`tank_id`,`at`);--> statement-breakpoint
CREATE TABLE `organisations` (
	`id` text PRIMARY KEY NOT NULL,
	`name` text NOT NULL,
	`settings` text DEFAULT '{}' NOT NULL,
	`created_at` text NOT NULL,
	`updated_at` text NOT NULL
);
--> statement-breakpoint
CREATE TABLE `plan_stages` (
	`id` text PRIMARY KEY NOT NULL,
	`tank_id` text NOT NULL,
	`position` integer NOT NULL,
	`key` text NOT NULL,
	`title` text NOT NULL,
	`status` text DEFAULT 'not-started' NOT NULL,
	`skip_reason` text,
	`checklist` text DEFAULT '[]' NOT NULL,
	`notes` text,
	`data` text DEFAULT '{}' NOT NULL,
	`completed_by` text,
	`completed_at` text,
	`created_at` text NOT NULL,
	`updated_at` text NOT NULL,
	FOREIGN KEY (`tank_id`) REFERENCES `tanks`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`completed_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `plan_stages_tank_position` ON `plan_stages` (`tank_id`,`position`);--> statement-breakpoint
CREATE TABLE `readings` (
	`id` text PRIMARY KEY NOT NULL,
	`tank_id` text NOT NULL,
	`taken_at` text NOT NULL,
	`entered_by` text,
	`ammonia_n` real,
	`nitrite_n` real,
	`nitrate_n` real,
	`ph` real,
	`temperature_c` real,
	`salinity` real,
	`alkalinity_dkh` real,
	`calcium_mg_l` real,
	`magnesium_mg_l` real,
	`phosphate_mg_l` real,
	`notes` text,
	`entered` text DEFAULT '{}' NOT NULL,
	`corrects_id` text,
	`correction_reason` text,
	`created_at` text NOT NULL,
	`updated_at` text NOT NULL,
	FOREIGN KEY (`tank_id`) REFERENCES `tanks`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`entered_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `readings_tank_taken` ON `readings` (`tank_id`,`taken_at`);--> statement-breakpoint
CREATE TABLE `sign_in_failures` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`key` text NOT NULL,
	`at` text NOT NULL
);
--> statement-breakpoint
CREATE INDEX `sign_in_failures_key_at` ON `sign_in_failures` (`key`,`at`);--> statement-breakpoint
CREATE TABLE `sites` (
	`id` text PRIMARY KEY NOT NULL,
	`organisation_id` text NOT NULL,
	`client_id` text NOT NULL,
	`label` text NOT NULL,
	`address` text,
	`room_notes` text,
	`access_notes` text,
	`archived_at` text,
	`created_at` text NOT NULL,
	`updated_at` text NOT NULL,
	FOREIGN KEY (`organisation_id`) REFERENCES `organisations`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`client_id`) REFERENCES `clients`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `sites_client_idx` ON `sites` (`client_id`);--> statement-breakpoint
CREATE TABLE `tank_verdicts` (
	`tank_id` text PRIMARY KEY NOT NULL,
	`phase` text NOT NULL,
	`verdict` text NOT NULL,
	`rule_set_version` text NOT NULL,
	`evaluated_at` text NOT NULL,
	FOREIGN KEY (`tank_id`) REFERENCES `tanks`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE TABLE `tanks` (
	`id` text PRIMARY KEY NOT NULL,
	`organisation_id` text NOT NULL,
	`client_id` text NOT NULL,
	`site_id` text,
	`name` text NOT NULL,
	`shape` text DEFAULT 'rectangular' NOT NULL,
	`dimensions` text DEFAULT '{}' NOT NULL,
	`volume_litres` real NOT NULL,
	`sump_litres` real DEFAULT 0 NOT NULL,
	`material` text DEFAULT 'glass' NOT NULL,
	`water_source` text DEFAULT 'mixed' NOT NULL,
	`cycle_method` text DEFAULT 'fishless' NOT NULL,
	`status` text DEFAULT 'planned' NOT NULL,
	`aquarist_id` text,
	`supervisor_id` text,
	`cycle_started_at` text,
	`kit_basis` text DEFAULT '{"ammonia":"NH3","nitrite":"NO2","nitrate":"NO3"}' NOT NULL,
	`archived_at` text,
	`created_at` text NOT NULL,
	`updated_at` text NOT NULL,
	FOREIGN KEY (`organisation_id`) REFERENCES `organisations`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`client_id`) REFERENCES `clients`(`id`) ON UPDATE no action ON DELETE restrict,
	FOREIGN KEY (`site_id`) REFERENCES `sites`(`id`) ON UPDATE no action ON DELETE set null,
	FOREIGN KEY (`aquarist_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null,
	FOREIGN KEY (`supervisor_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `tanks_org_idx` ON `tanks` (`organisation_id`);--> statement-breakpoint
CREATE INDEX `tanks_client_idx` ON `tanks` (`client_id`);--> statement-breakpoint
CREATE INDEX `tanks_aquarist_idx` ON `tanks` (`aquarist_id`);--> statement-breakpoint
CREATE TABLE `users` (
	`id` text PRIMARY KEY NOT NULL,
	`organisation_id` text NOT NULL,
	`email` text NOT NULL,
	`name` text NOT NULL,
	`role` text NOT NULL,
	`password_hash` text,
	`units` text DEFAULT 'metric' NOT NULL,
	`client_id` text,
	`active` integer DEFAULT true NOT NULL,
	`created_at` text NOT NULL,
	`updated_at` text NOT NULL,
	FOREIGN KEY (`organisation_id`) REFERENCES `organisations`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`client_id`) REFERENCES `clients`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `users_email_unique` ON `users` (`email`);--> statement-breakpoint
CREATE INDEX `users_org_idx` ON `users` (`organisation_id`);