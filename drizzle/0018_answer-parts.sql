CREATE TABLE `verdict_answer_parts` (
	`aggregate_id` integer NOT NULL,
	`part` text NOT NULL,
	`deflated` blob NOT NULL,
	`crc` integer NOT NULL,
	`length` integer NOT NULL,
	`extra` text NOT NULL,
	PRIMARY KEY(`aggregate_id`, `part`),
	FOREIGN KEY (`aggregate_id`) REFERENCES `verdict_aggregates`(`id`) ON UPDATE no action ON DELETE cascade
);
