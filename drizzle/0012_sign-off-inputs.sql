CREATE TABLE `sign_off_inputs` (
	`sign_off_id` text PRIMARY KEY NOT NULL,
	`input` text NOT NULL,
	FOREIGN KEY (`sign_off_id`) REFERENCES `sign_offs`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
-- Decisions made before: their input moves here unchanged (json_extract returns the object's JSON text) and leaves the snapshot.
INSERT INTO `sign_off_inputs` (`sign_off_id`, `input`)
	SELECT `id`, json_extract(`snapshot`, '$.input') FROM `sign_offs`
	WHERE `snapshot` IS NOT NULL AND json_type(`snapshot`, '$.input') = 'object';
--> statement-breakpoint
UPDATE `sign_offs` SET `snapshot` = json_remove(`snapshot`, '$.input')
	WHERE `snapshot` IS NOT NULL AND json_type(`snapshot`, '$.input') IS NOT NULL;
