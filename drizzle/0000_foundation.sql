CREATE TABLE `bench_runs` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`probe_id` integer NOT NULL,
	`file_id` integer NOT NULL,
	`row_count` integer NOT NULL,
	`rows` text NOT NULL,
	`fit` text NOT NULL,
	`created_by` integer,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`probe_id`) REFERENCES `probes`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`file_id`) REFERENCES `stored_files`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE TABLE `calibration_reminders` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`probe_id` integer NOT NULL,
	`kind` text NOT NULL,
	`sent_at` integer NOT NULL,
	FOREIGN KEY (`probe_id`) REFERENCES `probes`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `reminders_probe_idx` ON `calibration_reminders` (`probe_id`,`sent_at`);--> statement-breakpoint
CREATE TABLE `coefficient_sets` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`probe_id` integer NOT NULL,
	`version` integer NOT NULL,
	`status` text DEFAULT 'draft' NOT NULL,
	`effective_from` integer NOT NULL,
	`due_date` integer NOT NULL,
	`t_ref_ms` real NOT NULL,
	`alpha_per_k` real NOT NULL,
	`t_cal_c` real NOT NULL,
	`gains` text NOT NULL,
	`certificate_number` text NOT NULL,
	`certificate_file_id` integer,
	`bench_run_id` integer,
	`note` text DEFAULT '' NOT NULL,
	`drafted_by` integer,
	`approved_by` integer,
	`approved_at` integer,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`probe_id`) REFERENCES `probes`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`certificate_file_id`) REFERENCES `stored_files`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`bench_run_id`) REFERENCES `bench_runs`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`drafted_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`approved_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `coefficient_sets_probe_version_idx` ON `coefficient_sets` (`probe_id`,`version`);--> statement-breakpoint
CREATE INDEX `coefficient_sets_effective_idx` ON `coefficient_sets` (`probe_id`,`effective_from`);--> statement-breakpoint
CREATE TABLE `probes` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`organization_id` integer NOT NULL,
	`serial` text NOT NULL,
	`kind` text NOT NULL,
	`description` text DEFAULT '' NOT NULL,
	`status` text DEFAULT 'in_service' NOT NULL,
	`full_scale_counts` integer,
	`saturation_counts` integer,
	`floor_counts` integer,
	`gains` text,
	`range_low_lux` real,
	`range_high_lux` real,
	`scale` text,
	`accuracy_percent` real,
	`created_at` integer NOT NULL,
	`updated_at` integer NOT NULL,
	FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `probes_org_serial_idx` ON `probes` (`organization_id`,`serial`);--> statement-breakpoint
CREATE TABLE `audit_events` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`organization_id` integer NOT NULL,
	`actor_id` integer,
	`entity_type` text NOT NULL,
	`entity_id` integer NOT NULL,
	`action` text NOT NULL,
	`probe_id` integer,
	`survey_id` integer,
	`before` text,
	`after` text,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`actor_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `audit_org_idx` ON `audit_events` (`organization_id`,`created_at`);--> statement-breakpoint
CREATE INDEX `audit_probe_idx` ON `audit_events` (`probe_id`);--> statement-breakpoint
CREATE TABLE `organizations` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`name` text NOT NULL,
	`decision_rule` text DEFAULT 'guarded' NOT NULL,
	`created_at` integer NOT NULL
);
--> statement-breakpoint
CREATE TABLE `outbox_attachments` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`message_id` integer NOT NULL,
	`filename` text NOT NULL,
	`content_type` text NOT NULL,
	`content` blob NOT NULL,
	`size` integer NOT NULL,
	FOREIGN KEY (`message_id`) REFERENCES `outbox_messages`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE TABLE `outbox_messages` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`organization_id` integer,
	`to` text NOT NULL,
	`subject` text NOT NULL,
	`text` text NOT NULL,
	`html` text,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE TABLE `sessions` (
	`sid` text PRIMARY KEY NOT NULL,
	`data` text NOT NULL,
	`expires_at` integer NOT NULL
);
--> statement-breakpoint
CREATE INDEX `sessions_expires_idx` ON `sessions` (`expires_at`);--> statement-breakpoint
CREATE TABLE `stored_files` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`organization_id` integer NOT NULL,
	`sha256` text NOT NULL,
	`filename` text NOT NULL,
	`content_type` text NOT NULL,
	`size` integer NOT NULL,
	`created_by` integer,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `stored_files_hash_idx` ON `stored_files` (`organization_id`,`sha256`);--> statement-breakpoint
CREATE TABLE `tokens` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`user_id` integer NOT NULL,
	`purpose` text NOT NULL,
	`token_hash` text NOT NULL,
	`expires_at` integer NOT NULL,
	`used_at` integer,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `tokens_token_hash_unique` ON `tokens` (`token_hash`);--> statement-breakpoint
CREATE TABLE `user_sites` (
	`user_id` integer NOT NULL,
	`site_id` integer NOT NULL,
	PRIMARY KEY(`user_id`, `site_id`),
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE TABLE `users` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`organization_id` integer NOT NULL,
	`email` text NOT NULL,
	`name` text NOT NULL,
	`role` text NOT NULL,
	`status` text NOT NULL,
	`password_hash` text,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `users_email_unique` ON `users` (`email`);--> statement-breakpoint
CREATE INDEX `users_org_idx` ON `users` (`organization_id`);--> statement-breakpoint
CREATE TABLE `plans` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`site_id` integer NOT NULL,
	`name` text NOT NULL,
	`file_id` integer NOT NULL,
	`width_px` integer NOT NULL,
	`height_px` integer NOT NULL,
	`metres_per_pixel` real,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`site_id`) REFERENCES `sites`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`file_id`) REFERENCES `stored_files`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `plans_site_idx` ON `plans` (`site_id`);--> statement-breakpoint
CREATE TABLE `zones` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`plan_id` integer NOT NULL,
	`name` text NOT NULL,
	`kind` text NOT NULL,
	`use_type` text NOT NULL,
	`target_id` integer,
	`plane_height_m` real DEFAULT 0.75 NOT NULL,
	`wall_band_m` real DEFAULT 0.5 NOT NULL,
	`polygon` text NOT NULL,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`plan_id`) REFERENCES `plans`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `zones_plan_idx` ON `zones` (`plan_id`);--> statement-breakpoint
CREATE TABLE `decodes` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`survey_id` integer NOT NULL,
	`reason` text NOT NULL,
	`created_by` integer,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`survey_id`) REFERENCES `surveys`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE TABLE `log_imports` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`survey_id` integer NOT NULL,
	`file_id` integer NOT NULL,
	`status` text DEFAULT 'queued' NOT NULL,
	`progress` real DEFAULT 0 NOT NULL,
	`rows_read` integer DEFAULT 0 NOT NULL,
	`reading_count` integer DEFAULT 0 NOT NULL,
	`warnings` text DEFAULT '[]' NOT NULL,
	`errors` text DEFAULT '[]' NOT NULL,
	`created_by` integer,
	`created_at` integer NOT NULL,
	`finished_at` integer,
	FOREIGN KEY (`survey_id`) REFERENCES `surveys`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`file_id`) REFERENCES `stored_files`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `log_imports_survey_idx` ON `log_imports` (`survey_id`);--> statement-breakpoint
CREATE TABLE `readings` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`survey_id` integer NOT NULL,
	`decode_id` integer NOT NULL,
	`import_id` integer NOT NULL,
	`point` text NOT NULL,
	`x_m` real,
	`y_m` real,
	`role` text NOT NULL,
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
	FOREIGN KEY (`decode_id`) REFERENCES `decodes`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`import_id`) REFERENCES `log_imports`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`probe_id`) REFERENCES `probes`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `readings_decode_idx` ON `readings` (`decode_id`,`time_ms`);--> statement-breakpoint
CREATE INDEX `readings_survey_idx` ON `readings` (`survey_id`);--> statement-breakpoint
CREATE TABLE `samples` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`import_id` integer NOT NULL,
	`survey_id` integer NOT NULL,
	`line` integer NOT NULL,
	`time_ms` integer NOT NULL,
	`probe_id` integer NOT NULL,
	`point` text NOT NULL,
	`gain_code` integer,
	`counts` integer,
	`ma` real,
	`volts` real,
	`int_ms` real,
	`temp_c` real,
	`x_m` real,
	`y_m` real,
	`role` text DEFAULT 'task' NOT NULL,
	`note` text,
	FOREIGN KEY (`import_id`) REFERENCES `log_imports`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`probe_id`) REFERENCES `probes`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `samples_import_idx` ON `samples` (`import_id`);--> statement-breakpoint
CREATE TABLE `sites` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`organization_id` integer NOT NULL,
	`name` text NOT NULL,
	`address` text,
	`time_zone` text NOT NULL,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `sites_org_idx` ON `sites` (`organization_id`);--> statement-breakpoint
CREATE TABLE `surveys` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`organization_id` integer NOT NULL,
	`site_id` integer NOT NULL,
	`name` text NOT NULL,
	`started_on` text,
	`conditions` text,
	`status` text DEFAULT 'draft' NOT NULL,
	`active_decode_id` integer,
	`review_comment` text,
	`submitted_by` integer,
	`submitted_at` integer,
	`signed_off_by` integer,
	`signed_off_at` integer,
	`frozen` text,
	`created_by` integer,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`site_id`) REFERENCES `sites`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`submitted_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`signed_off_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `surveys_site_idx` ON `surveys` (`site_id`);--> statement-breakpoint
CREATE INDEX `surveys_org_idx` ON `surveys` (`organization_id`);--> statement-breakpoint
CREATE TABLE `targets` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`organization_id` integer,
	`use_type` text NOT NULL,
	`name` text NOT NULL,
	`em_lux` real NOT NULL,
	`source_unit` text DEFAULT 'lx' NOT NULL,
	`u0_min` real,
	`df_target_percent` real,
	`source` text NOT NULL,
	`confidence` text NOT NULL,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `targets_org_idx` ON `targets` (`organization_id`);