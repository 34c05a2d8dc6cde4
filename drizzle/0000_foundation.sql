CREATE TABLE `alerts` (
	`id` text PRIMARY KEY NOT NULL,
	`organisation_id` text NOT NULL,
	`tank_id` text NOT NULL,
	`kind` text NOT NULL,
	`status` text DEFAULT 'open' NOT NULL,
	`message` text NOT NULL,
	`opened_by_reading_id` text,
	`last_reading_id` text,
	`detail` text DEFAULT '{}' NOT NULL,
	`opened_at` text NOT NULL,
	`acknowledged_at` text,
	`acknowledged_by` text,
	`acknowledge_note` text,
	`escalated_at` text,
	`resolved_at` text,
	`resolved_by` text,
	`resolve_note` text,
	`open_key` text,
	`created_at` text NOT NULL,
	`updated_at` text NOT NULL,
	FOREIGN KEY (`organisation_id`) REFERENCES `organisations`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`tank_id`) REFERENCES `tanks`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`opened_by_reading_id`) REFERENCES `readings`(`id`) ON UPDATE no action ON DELETE set null,
	FOREIGN KEY (`last_reading_id`) REFERENCES `readings`(`id`) ON UPDATE no action ON DELETE set null,
	FOREIGN KEY (`acknowledged_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null,
	FOREIGN KEY (`resolved_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `alerts_one_open_per_kind` ON `alerts` (`open_key`);--> statement-breakpoint
CREATE INDEX `alerts_tank_idx` ON `alerts` (`tank_id`);--> statement-breakpoint
CREATE INDEX `alerts_org_status_idx` ON `alerts` (`organisation_id`,`status`);--> statement-breakpoint
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
CREATE TABLE `auth_tokens` (
	`id` text PRIMARY KEY NOT NULL,
	`user_id` text NOT NULL,
	`purpose` text NOT NULL,
	`token_hash` text NOT NULL,
	`expires_at` text NOT NULL,
	`used_at` text,
	`created_at` text NOT NULL,
	`updated_at` text NOT NULL,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `auth_tokens_hash` ON `auth_tokens` (`token_hash`);--> statement-breakpoint
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
	`corrects_id` text,
	`correction_reason` text,
	`created_at` text NOT NULL,
	`updated_at` text NOT NULL,
	FOREIGN KEY (`tank_id`) REFERENCES `tanks`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`entered_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `events_tank_at` ON `events` (`tank_id`,`at`);--> statement-breakpoint
CREATE TABLE `mail_outbox` (
	`id` text PRIMARY KEY NOT NULL,
	`organisation_id` text,
	`to_address` text NOT NULL,
	`subject` text NOT NULL,
	`text_body` text NOT NULL,
	`html_body` text,
	`kind` text NOT NULL,
	`message_id` text NOT NULL,
	`status` text DEFAULT 'pending' NOT NULL,
	`attempts` integer DEFAULT 0 NOT NULL,
	`next_attempt_at` text NOT NULL,
	`last_error` text,
	`sent_at` text,
	`created_at` text NOT NULL,
	`updated_at` text NOT NULL
);
--> statement-breakpoint
CREATE INDEX `mail_outbox_due_idx` ON `mail_outbox` (`status`,`next_attempt_at`);--> statement-breakpoint
CREATE UNIQUE INDEX `mail_outbox_message_id` ON `mail_outbox` (`message_id`);--> statement-breakpoint
CREATE TABLE `notification_preferences` (
	`user_id` text PRIMARY KEY NOT NULL,
	`email_kinds` text DEFAULT '{}' NOT NULL,
	`created_at` text NOT NULL,
	`updated_at` text NOT NULL,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE TABLE `notifications` (
	`id` text PRIMARY KEY NOT NULL,
	`user_id` text NOT NULL,
	`organisation_id` text NOT NULL,
	`kind` text NOT NULL,
	`title` text NOT NULL,
	`body` text NOT NULL,
	`link` text,
	`alert_id` text,
	`read_at` text,
	`created_at` text NOT NULL,
	`updated_at` text NOT NULL,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`organisation_id`) REFERENCES `organisations`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`alert_id`) REFERENCES `alerts`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `notifications_user_read_idx` ON `notifications` (`user_id`,`read_at`);--> statement-breakpoint
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
CREATE TABLE `plan_template_stages` (
	`id` text PRIMARY KEY NOT NULL,
	`organisation_id` text NOT NULL,
	`position` integer NOT NULL,
	`key` text NOT NULL,
	`title` text NOT NULL,
	`checklist` text DEFAULT '[]' NOT NULL,
	`created_at` text NOT NULL,
	`updated_at` text NOT NULL,
	FOREIGN KEY (`organisation_id`) REFERENCES `organisations`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `plan_template_org_position` ON `plan_template_stages` (`organisation_id`,`position`);--> statement-breakpoint
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
	`import_key` text,
	`created_at` text NOT NULL,
	`updated_at` text NOT NULL,
	FOREIGN KEY (`tank_id`) REFERENCES `tanks`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`entered_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `readings_tank_taken` ON `readings` (`tank_id`,`taken_at`);--> statement-breakpoint
CREATE UNIQUE INDEX `readings_tank_import_key` ON `readings` (`tank_id`,`import_key`);--> statement-breakpoint
CREATE TABLE `sign_in_failures` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`key` text NOT NULL,
	`at` text NOT NULL
);
--> statement-breakpoint
CREATE INDEX `sign_in_failures_key_at` ON `sign_in_failures` (`key`,`at`);--> statement-breakpoint
CREATE TABLE `sign_offs` (
	`id` text PRIMARY KEY NOT NULL,
	`organisation_id` text NOT NULL,
	`tank_id` text NOT NULL,
	`requested_by` text,
	`requested_at` text NOT NULL,
	`request_note` text,
	`status` text DEFAULT 'requested' NOT NULL,
	`decided_by` text,
	`decided_at` text,
	`decision_note` text,
	`override` integer DEFAULT false NOT NULL,
	`snapshot` text,
	`rule_set_version` text,
	`verification_code` text,
	`reopened_by` text,
	`reopened_at` text,
	`reopen_reason` text,
	`created_at` text NOT NULL,
	`updated_at` text NOT NULL,
	FOREIGN KEY (`organisation_id`) REFERENCES `organisations`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`tank_id`) REFERENCES `tanks`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`requested_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null,
	FOREIGN KEY (`decided_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null,
	FOREIGN KEY (`reopened_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `sign_offs_tank_idx` ON `sign_offs` (`tank_id`);--> statement-breakpoint
CREATE UNIQUE INDEX `sign_offs_verification` ON `sign_offs` (`verification_code`);--> statement-breakpoint
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
	`usual_test_hour` integer,
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
CREATE TABLE `uploads` (
	`id` text PRIMARY KEY NOT NULL,
	`organisation_id` text NOT NULL,
	`tank_id` text NOT NULL,
	`stage_id` text,
	`reading_id` text,
	`mime_type` text NOT NULL,
	`size_bytes` integer NOT NULL,
	`original_name` text NOT NULL,
	`storage_key` text NOT NULL,
	`thumbnail_key` text,
	`uploaded_by` text,
	`created_at` text NOT NULL,
	`updated_at` text NOT NULL,
	FOREIGN KEY (`organisation_id`) REFERENCES `organisations`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`tank_id`) REFERENCES `tanks`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`stage_id`) REFERENCES `plan_stages`(`id`) ON UPDATE no action ON DELETE set null,
	FOREIGN KEY (`reading_id`) REFERENCES `readings`(`id`) ON UPDATE no action ON DELETE set null,
	FOREIGN KEY (`uploaded_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `uploads_tank_idx` ON `uploads` (`tank_id`);--> statement-breakpoint
CREATE INDEX `uploads_stage_idx` ON `uploads` (`stage_id`);--> statement-breakpoint
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