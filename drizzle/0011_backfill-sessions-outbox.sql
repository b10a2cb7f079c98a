-- Sessions from before user_id existed: their account, so a reset or role change ends them too.
UPDATE `sessions` SET `user_id` = json_extract(`data`, '$.userId') WHERE `user_id` IS NULL AND json_valid(`data`) AND json_type(`data`, '$.userId') = 'integer' AND json_extract(`data`, '$.userId') IN (SELECT `id` FROM `users`);--> statement-breakpoint
-- Mail kept before the queue existed was delivered into the outbox when it was written.
UPDATE `outbox_messages` SET `sent_at` = `created_at`, `attempts` = 1 WHERE `sent_at` IS NULL AND `status` = 'sent';
