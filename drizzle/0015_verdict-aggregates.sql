CREATE TABLE `reading_counts` (
	`decode_id` integer NOT NULL,
	`import_id` integer NOT NULL,
	`readings` integer NOT NULL,
	PRIMARY KEY(`decode_id`, `import_id`),
	FOREIGN KEY (`decode_id`) REFERENCES `decodes`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`import_id`) REFERENCES `log_imports`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE TABLE `verdict_aggregate_zones` (
	`aggregate_id` integer NOT NULL,
	`zone_id` integer NOT NULL,
	`reading_ids` blob NOT NULL,
	`wall_band_reading_ids` blob NOT NULL,
	`other_plane_reading_ids` blob NOT NULL,
	`point_df` blob NOT NULL,
	PRIMARY KEY(`aggregate_id`, `zone_id`),
	FOREIGN KEY (`aggregate_id`) REFERENCES `verdict_aggregates`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE TABLE `verdict_aggregates` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`survey_id` integer NOT NULL,
	`inputs_key` text NOT NULL,
	`frozen` integer DEFAULT false NOT NULL,
	`summary` text NOT NULL,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`survey_id`) REFERENCES `surveys`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `verdict_aggregates_key_idx` ON `verdict_aggregates` (`survey_id`,`inputs_key`);--> statement-breakpoint
CREATE INDEX `readings_field_record_idx` ON `readings` (`field_record_id`);--> statement-breakpoint
-- Kept counts for the readings already stored (reading-counts.ts keeps them from now on).
INSERT INTO `reading_counts` (`decode_id`, `import_id`, `readings`) SELECT `decode_id`, `import_id`, count(*) FROM `readings` WHERE `import_id` IS NOT NULL GROUP BY `decode_id`, `import_id`;
