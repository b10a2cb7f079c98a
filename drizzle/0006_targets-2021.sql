ALTER TABLE `zones` ADD `chosen_em_lux` real;--> statement-breakpoint
ALTER TABLE `zones` ADD `context_modifiers` text DEFAULT '[]' NOT NULL;--> statement-breakpoint
ALTER TABLE `zones` ADD `context_note` text;--> statement-breakpoint
ALTER TABLE `readings` ADD `plane` text DEFAULT 'horizontal' NOT NULL;--> statement-breakpoint
ALTER TABLE `readings` ADD `azimuth_deg` real;--> statement-breakpoint
ALTER TABLE `surveys` ADD `installation` text DEFAULT 'in_service' NOT NULL;--> statement-breakpoint
ALTER TABLE `surveys` ADD `maintenance_factor` real;--> statement-breakpoint
ALTER TABLE `surveys` ADD `mf_parts` text;--> statement-breakpoint
ALTER TABLE `targets` ADD `em_modified_lux` real;--> statement-breakpoint
ALTER TABLE `targets` ADD `ez_lux` real;--> statement-breakpoint
ALTER TABLE `targets` ADD `em_wall_lux` real;--> statement-breakpoint
ALTER TABLE `targets` ADD `em_ceiling_lux` real;--> statement-breakpoint
ALTER TABLE `targets` ADD `ra` integer;--> statement-breakpoint
ALTER TABLE `targets` ADD `rugl` integer;