CREATE TABLE `sign_off_input_entries` (
	`sign_off_id` text NOT NULL,
	`entry_id` text NOT NULL,
	PRIMARY KEY(`sign_off_id`, `entry_id`),
	FOREIGN KEY (`sign_off_id`) REFERENCES `sign_offs`(`id`) ON UPDATE no action ON DELETE cascade
) WITHOUT ROWID;
--> statement-breakpoint
-- Decisions made before: the tests and events their stored input holds, read from it once here (the input itself is unchanged).
INSERT INTO `sign_off_input_entries` (`sign_off_id`, `entry_id`)
	SELECT `sign_off_id`, json_extract(`value`, '$.id') FROM `sign_off_inputs`, json_each(`input`, '$.readings')
	WHERE json_extract(`value`, '$.id') IS NOT NULL
	UNION
	SELECT `sign_off_id`, json_extract(`value`, '$.id') FROM `sign_off_inputs`, json_each(`input`, '$.events')
	WHERE json_extract(`value`, '$.id') IS NOT NULL;
