DROP INDEX `readings_tank_taken`;--> statement-breakpoint
CREATE INDEX `readings_tank_taken` ON `readings` (`tank_id`,`taken_at`,`created_at`);