CREATE TABLE `emergency_criteria_sets` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`organization_id` integer NOT NULL,
	`name` text NOT NULL,
	`source` text NOT NULL,
	`required_passes` text NOT NULL,
	`checks` text NOT NULL,
	`notes` text NOT NULL,
	`created_by` integer,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `emergency_criteria_sets_org_idx` ON `emergency_criteria_sets` (`organization_id`);--> statement-breakpoint
CREATE TABLE `emergency_elements` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`plan_id` integer NOT NULL,
	`kind` text NOT NULL,
	`code` text NOT NULL,
	`name` text NOT NULL,
	`geometry` text NOT NULL,
	`width_m` real,
	`stair` integer DEFAULT false NOT NULL,
	`border_m` real,
	`spacing_m` real,
	`normal_em_lux` real,
	`normal_zone_id` integer,
	`equipment` text,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`plan_id`) REFERENCES `plans`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `emergency_elements_plan_idx` ON `emergency_elements` (`plan_id`);--> statement-breakpoint
CREATE UNIQUE INDEX `emergency_elements_code_idx` ON `emergency_elements` (`plan_id`,`code`);--> statement-breakpoint
CREATE TABLE `emergency_responses` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`survey_id` integer NOT NULL,
	`element_id` integer NOT NULL,
	`to_half_s` real,
	`to_full_s` real,
	FOREIGN KEY (`survey_id`) REFERENCES `surveys`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`element_id`) REFERENCES `emergency_elements`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `emergency_responses_idx` ON `emergency_responses` (`survey_id`,`element_id`);--> statement-breakpoint
CREATE TABLE `emergency_surveys` (
	`survey_id` integer PRIMARY KEY NOT NULL,
	`criteria_set_key` text NOT NULL,
	`system_type` text NOT NULL,
	`rated_duration_min` integer NOT NULL,
	`mains_off_at` integer NOT NULL,
	`normal_lighting_off` integer NOT NULL,
	`daylight_excluded` integer NOT NULL,
	`notes` text,
	FOREIGN KEY (`survey_id`) REFERENCES `surveys`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE TABLE `emergency_test_reminders` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`site_id` integer NOT NULL,
	`kind` text NOT NULL,
	`state` text NOT NULL,
	`sent_at` integer NOT NULL,
	FOREIGN KEY (`site_id`) REFERENCES `sites`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `emergency_test_reminders_site_idx` ON `emergency_test_reminders` (`site_id`,`sent_at`);--> statement-breakpoint
CREATE TABLE `emergency_test_schedules` (
	`organization_id` integer PRIMARY KEY NOT NULL,
	`functional_every_days` integer NOT NULL,
	`full_duration_every_months` integer NOT NULL,
	FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE TABLE `emergency_tests` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`organization_id` integer NOT NULL,
	`site_id` integer NOT NULL,
	`kind` text NOT NULL,
	`tested_on` text NOT NULL,
	`tested_by` text NOT NULL,
	`result` text NOT NULL,
	`failed_fittings` text NOT NULL,
	`remarks` text NOT NULL,
	`recorded_by` integer,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`organization_id`) REFERENCES `organizations`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`site_id`) REFERENCES `sites`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`recorded_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `emergency_tests_site_idx` ON `emergency_tests` (`site_id`,`tested_on`);