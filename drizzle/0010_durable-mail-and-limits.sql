CREATE TABLE `jobs` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`name` text NOT NULL,
	`data` text NOT NULL,
	`status` text DEFAULT 'queued' NOT NULL,
	`attempts` integer DEFAULT 0 NOT NULL,
	`max_attempts` integer NOT NULL,
	`run_at` integer NOT NULL,
	`locked_until` integer,
	`last_error` text,
	`created_at` integer NOT NULL,
	`finished_at` integer
);
--> statement-breakpoint
CREATE INDEX `jobs_due_idx` ON `jobs` (`status`,`run_at`);--> statement-breakpoint
CREATE TABLE `rate_limit_hits` (
	`key` text PRIMARY KEY NOT NULL,
	`hits` integer NOT NULL,
	`reset_at` integer NOT NULL
);
--> statement-breakpoint
CREATE INDEX `rate_limit_reset_idx` ON `rate_limit_hits` (`reset_at`);--> statement-breakpoint
ALTER TABLE `outbox_messages` ADD `status` text DEFAULT 'sent' NOT NULL;--> statement-breakpoint
ALTER TABLE `outbox_messages` ADD `attempts` integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE `outbox_messages` ADD `last_error` text;--> statement-breakpoint
ALTER TABLE `outbox_messages` ADD `next_attempt_at` integer;--> statement-breakpoint
ALTER TABLE `outbox_messages` ADD `sent_at` integer;--> statement-breakpoint
ALTER TABLE `outbox_messages` ADD `pending_attachments` text;--> statement-breakpoint
CREATE INDEX `outbox_org_idx` ON `outbox_messages` (`organization_id`,`id`);--> statement-breakpoint
ALTER TABLE `sessions` ADD `user_id` integer REFERENCES users(id);--> statement-breakpoint
CREATE INDEX `sessions_user_idx` ON `sessions` (`user_id`);