CREATE TABLE `field_photos` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`organization_id` integer NOT NULL,
	`survey_id` integer NOT NULL,
	`idempotency_key` text NOT NULL,
	`file_id` integer NOT NULL,
	`point` text,
	`planned_point_id` integer,
	`zone_id` integer,
	`note` text,
	`width_px` integer NOT NULL,
	`height_px` integer NOT NULL,
	`location_kept` integer NOT NULL,
	`taken_at` integer NOT NULL,
	`created_by` integer,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`survey_id`) REFERENCES `surveys`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`file_id`) REFERENCES `stored_files`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`zone_id`) REFERENCES `zones`(`id`) ON UPDATE no action ON DELETE set null,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `field_photos_key_uq` ON `field_photos` (`survey_id`,`idempotency_key`);--> statement-breakpoint
CREATE TABLE `field_records` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`organization_id` integer NOT NULL,
	`survey_id` integer NOT NULL,
	`idempotency_key` text NOT NULL,
	`kind` text NOT NULL,
	`session_id` integer,
	`point` text NOT NULL,
	`planned_point_id` integer,
	`plan_id` integer,
	`x_m` real,
	`y_m` real,
	`probe_id` integer,
	`values` text,
	`unit` text,
	`lights` text,
	`reason` text,
	`note` text,
	`time_ms` integer NOT NULL,
	`created_by` integer,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`survey_id`) REFERENCES `surveys`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`session_id`) REFERENCES `field_sessions`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`plan_id`) REFERENCES `plans`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`probe_id`) REFERENCES `probes`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `field_records_key_uq` ON `field_records` (`survey_id`,`idempotency_key`);--> statement-breakpoint
CREATE INDEX `field_records_survey_idx` ON `field_records` (`survey_id`,`time_ms`);--> statement-breakpoint
CREATE TABLE `field_sessions` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`organization_id` integer NOT NULL,
	`survey_id` integer NOT NULL,
	`idempotency_key` text NOT NULL,
	`measured_by` text NOT NULL,
	`started_at` integer NOT NULL,
	`lights_on_at` integer,
	`supply_voltage_v` real,
	`ambient_temp_c` real,
	`sky` text,
	`blinds` text,
	`lamp_burn_in_hours` real,
	`daylight_excluded` integer NOT NULL,
	`note` text,
	`created_by` integer,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`survey_id`) REFERENCES `surveys`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `field_sessions_key_uq` ON `field_sessions` (`survey_id`,`idempotency_key`);--> statement-breakpoint
CREATE TABLE `mark_matchings` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`import_id` integer NOT NULL,
	`window_ms` integer NOT NULL,
	`clock_offset_ms` integer NOT NULL,
	`result` text NOT NULL,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`import_id`) REFERENCES `log_imports`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `mark_matchings_import_uq` ON `mark_matchings` (`import_id`);--> statement-breakpoint
PRAGMA foreign_keys=OFF;--> statement-breakpoint
CREATE TABLE `__new_readings` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`survey_id` integer NOT NULL,
	`decode_id` integer NOT NULL,
	`import_id` integer,
	`field_record_id` integer,
	`point` text NOT NULL,
	`x_m` real,
	`y_m` real,
	`plan_id` integer,
	`role` text NOT NULL,
	`plane` text DEFAULT 'horizontal' NOT NULL,
	`azimuth_deg` real,
	`time_ms` integer NOT NULL,
	`probe_id` integer NOT NULL,
	`lux` real,
	`u_lux` real,
	`lux_bound` text NOT NULL,
	`flag` text NOT NULL,
	`gain_code` integer,
	`sample_count` integer NOT NULL,
	`chosen_sample` integer,
	`coefficient_set_id` integer,
	`budget` text,
	`note` text,
	`raw_counts` real,
	`raw_signal` real,
	`int_ms` real,
	`temp_c` real,
	`excluded_reason` text,
	FOREIGN KEY (`decode_id`) REFERENCES `decodes`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`import_id`) REFERENCES `log_imports`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`plan_id`) REFERENCES `plans`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`probe_id`) REFERENCES `probes`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
INSERT INTO `__new_readings`("id", "survey_id", "decode_id", "import_id", "point", "x_m", "y_m", "plan_id", "role", "plane", "azimuth_deg", "time_ms", "probe_id", "lux", "u_lux", "lux_bound", "flag", "gain_code", "sample_count", "chosen_sample", "coefficient_set_id", "budget", "note", "raw_counts", "raw_signal", "int_ms", "temp_c", "excluded_reason") SELECT "id", "survey_id", "decode_id", "import_id", "point", "x_m", "y_m", "plan_id", "role", "plane", "azimuth_deg", "time_ms", "probe_id", "lux", "u_lux", "lux_bound", "flag", "gain_code", "sample_count", "chosen_sample", "coefficient_set_id", "budget", "note", "raw_counts", "raw_signal", "int_ms", "temp_c", "excluded_reason" FROM `readings`;--> statement-breakpoint
DROP TABLE `readings`;--> statement-breakpoint
ALTER TABLE `__new_readings` RENAME TO `readings`;--> statement-breakpoint
PRAGMA foreign_keys=ON;--> statement-breakpoint
CREATE INDEX `readings_decode_idx` ON `readings` (`decode_id`,`time_ms`);--> statement-breakpoint
CREATE INDEX `readings_survey_idx` ON `readings` (`survey_id`);--> statement-breakpoint
ALTER TABLE `probes` ADD `meter_class` text;