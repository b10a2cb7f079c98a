ALTER TABLE `readings` ADD `raw_counts` real;--> statement-breakpoint
ALTER TABLE `readings` ADD `raw_signal` real;--> statement-breakpoint
ALTER TABLE `readings` ADD `int_ms` real;--> statement-breakpoint
ALTER TABLE `readings` ADD `temp_c` real;