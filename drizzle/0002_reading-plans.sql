ALTER TABLE `log_imports` ADD `plan_id` integer REFERENCES plans(id);--> statement-breakpoint
ALTER TABLE `readings` ADD `plan_id` integer REFERENCES plans(id);--> statement-breakpoint
ALTER TABLE `samples` ADD `plan_id` integer REFERENCES plans(id);--> statement-breakpoint
-- Earlier positioned readings and samples of a site with exactly one plan were on that plan; on sites with several plans they stay unplaced (null).
UPDATE `readings` SET `plan_id` = (SELECT p.`id` FROM `plans` p JOIN `surveys` s ON s.`site_id` = p.`site_id` WHERE s.`id` = `readings`.`survey_id`)
WHERE `x_m` IS NOT NULL AND (SELECT count(*) FROM `plans` p JOIN `surveys` s ON s.`site_id` = p.`site_id` WHERE s.`id` = `readings`.`survey_id`) = 1;--> statement-breakpoint
UPDATE `samples` SET `plan_id` = (SELECT p.`id` FROM `plans` p JOIN `surveys` s ON s.`site_id` = p.`site_id` WHERE s.`id` = `samples`.`survey_id`)
WHERE `x_m` IS NOT NULL AND (SELECT count(*) FROM `plans` p JOIN `surveys` s ON s.`site_id` = p.`site_id` WHERE s.`id` = `samples`.`survey_id`) = 1;
