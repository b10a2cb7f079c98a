CREATE TABLE `planned_points` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`survey_id` integer NOT NULL,
	`grid_id` integer NOT NULL,
	`plan_id` integer NOT NULL,
	`zone_id` integer NOT NULL,
	`label` text NOT NULL,
	`label_key` text NOT NULL,
	`x_m` real NOT NULL,
	`y_m` real NOT NULL,
	`origin` text NOT NULL,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`survey_id`) REFERENCES `surveys`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`grid_id`) REFERENCES `survey_grids`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`plan_id`) REFERENCES `plans`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`zone_id`) REFERENCES `zones`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `planned_points_label_uq` ON `planned_points` (`survey_id`,`label_key`);--> statement-breakpoint
CREATE INDEX `planned_points_plan_idx` ON `planned_points` (`survey_id`,`plan_id`);--> statement-breakpoint
CREATE TABLE `reading_placements` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`survey_id` integer NOT NULL,
	`point` text NOT NULL,
	`probe_id` integer NOT NULL,
	`time_ms` integer NOT NULL,
	`state` text NOT NULL,
	`plan_id` integer,
	`x_m` real,
	`y_m` real,
	`planned_point_id` integer,
	`place_reason` text,
	`excluded_reason` text,
	`updated_by` integer,
	`updated_at` integer NOT NULL,
	FOREIGN KEY (`survey_id`) REFERENCES `surveys`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`probe_id`) REFERENCES `probes`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`plan_id`) REFERENCES `plans`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`planned_point_id`) REFERENCES `planned_points`(`id`) ON UPDATE no action ON DELETE set null,
	FOREIGN KEY (`updated_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `reading_placements_key_uq` ON `reading_placements` (`survey_id`,`point`,`probe_id`,`time_ms`);--> statement-breakpoint
CREATE TABLE `survey_grids` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`survey_id` integer NOT NULL,
	`zone_id` integer NOT NULL,
	`plan_id` integer NOT NULL,
	`code` text NOT NULL,
	`rounding` text NOT NULL,
	`layout` text NOT NULL,
	`spacing_m` real NOT NULL,
	`d_m` real NOT NULL,
	`generated` text NOT NULL,
	`reason` text,
	`created_by` integer,
	`created_at` integer NOT NULL,
	`updated_at` integer NOT NULL,
	FOREIGN KEY (`survey_id`) REFERENCES `surveys`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`zone_id`) REFERENCES `zones`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`plan_id`) REFERENCES `plans`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `survey_grids_zone_uq` ON `survey_grids` (`survey_id`,`zone_id`);--> statement-breakpoint
CREATE UNIQUE INDEX `survey_grids_code_uq` ON `survey_grids` (`survey_id`,`code`);--> statement-breakpoint
ALTER TABLE `organizations` ADD `grid_rounding` text DEFAULT 'next_higher' NOT NULL;--> statement-breakpoint
ALTER TABLE `log_imports` ADD `placement` text;--> statement-breakpoint
ALTER TABLE `readings` ADD `excluded_reason` text;--> statement-breakpoint
ALTER TABLE `surveys` ADD `grid_rounding` text DEFAULT 'next_higher' NOT NULL;