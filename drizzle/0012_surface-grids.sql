DROP INDEX `survey_grids_zone_uq`;--> statement-breakpoint
DROP INDEX `survey_grids_code_uq`;--> statement-breakpoint
ALTER TABLE `survey_grids` ADD `surface` text DEFAULT 'working_plane' NOT NULL;--> statement-breakpoint
ALTER TABLE `survey_grids` ADD `wall_height_m` real;--> statement-breakpoint
CREATE UNIQUE INDEX `survey_grids_zone_surface_uq` ON `survey_grids` (`survey_id`,`zone_id`,`surface`);--> statement-breakpoint
CREATE UNIQUE INDEX `survey_grids_code_surface_uq` ON `survey_grids` (`survey_id`,`code`,`surface`);--> statement-breakpoint
ALTER TABLE `planned_points` ADD `plane` text DEFAULT 'horizontal' NOT NULL;--> statement-breakpoint
ALTER TABLE `planned_points` ADD `height_m` real;--> statement-breakpoint
ALTER TABLE `planned_points` ADD `azimuth_deg` real;