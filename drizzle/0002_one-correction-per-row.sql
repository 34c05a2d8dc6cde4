CREATE UNIQUE INDEX `events_corrects_unique` ON `events` (`corrects_id`);--> statement-breakpoint
CREATE UNIQUE INDEX `readings_corrects_unique` ON `readings` (`corrects_id`);