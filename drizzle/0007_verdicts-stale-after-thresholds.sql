ALTER TABLE `tank_verdicts` ADD `stale` integer DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE `tank_verdicts` ADD `phase_before_reevaluation` text;