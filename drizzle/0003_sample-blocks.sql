CREATE TABLE `sample_blocks` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`import_id` integer NOT NULL,
	`survey_id` integer NOT NULL,
	`first_line` integer NOT NULL,
	`row_count` integer NOT NULL,
	`encoding` text NOT NULL,
	`strings` text,
	`data` blob NOT NULL,
	FOREIGN KEY (`import_id`) REFERENCES `log_imports`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `sample_blocks_import_idx` ON `sample_blocks` (`import_id`);--> statement-breakpoint
-- Moves kept samples into 'json' blocks of 1,024 per import, in id (file) order: each block's data is
-- one flat JSON array of the SAMPLE_SLOTS values of server/modules/imports/batch-format.mjs per sample.
INSERT INTO `sample_blocks` (`import_id`, `survey_id`, `first_line`, `row_count`, `encoding`, `strings`, `data`)
SELECT `import_id`, `survey_id`, min(`line`), count(*), 'json', NULL,
	CAST('[' || group_concat(substr(`r`, 2, length(`r`) - 2), ',' ORDER BY `id`) || ']' AS BLOB)
FROM (
	SELECT `id`, `import_id`, `survey_id`, `line`,
		(row_number() OVER (PARTITION BY `import_id` ORDER BY `id`) - 1) / 1024 AS `block`,
		json_array(`line`, `time_ms`, `probe_id`, `point`, `gain_code`, `counts`, `ma`, `volts`, `int_ms`, `temp_c`, `x_m`, `y_m`, `plan_id`, `role`, `note`) AS `r`
	FROM `samples`
)
GROUP BY `import_id`, `block`
ORDER BY `import_id`, `block`;
