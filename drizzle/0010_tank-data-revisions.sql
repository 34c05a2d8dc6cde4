CREATE TABLE `tank_data_revisions` (
	`tank_id` text PRIMARY KEY NOT NULL,
	`revision` integer NOT NULL
);
--> statement-breakpoint
CREATE TRIGGER `readings_count_insert` AFTER INSERT ON `readings`
BEGIN
  INSERT INTO `tank_data_revisions` (`tank_id`, `revision`) VALUES (NEW.`tank_id`, 1)
    ON CONFLICT (`tank_id`) DO UPDATE SET `revision` = `revision` + 1;
END;
--> statement-breakpoint
CREATE TRIGGER `readings_count_update` AFTER UPDATE ON `readings`
BEGIN
  INSERT INTO `tank_data_revisions` (`tank_id`, `revision`) VALUES (OLD.`tank_id`, 1)
    ON CONFLICT (`tank_id`) DO UPDATE SET `revision` = `revision` + 1;
  INSERT INTO `tank_data_revisions` (`tank_id`, `revision`) VALUES (NEW.`tank_id`, 1)
    ON CONFLICT (`tank_id`) DO UPDATE SET `revision` = `revision` + 1;
END;
--> statement-breakpoint
CREATE TRIGGER `readings_count_delete` AFTER DELETE ON `readings`
BEGIN
  INSERT INTO `tank_data_revisions` (`tank_id`, `revision`) VALUES (OLD.`tank_id`, 1)
    ON CONFLICT (`tank_id`) DO UPDATE SET `revision` = `revision` + 1;
END;
--> statement-breakpoint
CREATE TRIGGER `events_count_insert` AFTER INSERT ON `events`
BEGIN
  INSERT INTO `tank_data_revisions` (`tank_id`, `revision`) VALUES (NEW.`tank_id`, 1)
    ON CONFLICT (`tank_id`) DO UPDATE SET `revision` = `revision` + 1;
END;
--> statement-breakpoint
CREATE TRIGGER `events_count_update` AFTER UPDATE ON `events`
BEGIN
  INSERT INTO `tank_data_revisions` (`tank_id`, `revision`) VALUES (OLD.`tank_id`, 1)
    ON CONFLICT (`tank_id`) DO UPDATE SET `revision` = `revision` + 1;
  INSERT INTO `tank_data_revisions` (`tank_id`, `revision`) VALUES (NEW.`tank_id`, 1)
    ON CONFLICT (`tank_id`) DO UPDATE SET `revision` = `revision` + 1;
END;
--> statement-breakpoint
CREATE TRIGGER `events_count_delete` AFTER DELETE ON `events`
BEGIN
  INSERT INTO `tank_data_revisions` (`tank_id`, `revision`) VALUES (OLD.`tank_id`, 1)
    ON CONFLICT (`tank_id`) DO UPDATE SET `revision` = `revision` + 1;
END;
