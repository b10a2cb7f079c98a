-- Existing databases: the shipped office entry gains its EN 12464-1:2021 fields (secondary sources),
-- and the shipped filing and copying entry is added where a shipped library exists. New databases get
-- both from the seed (server/modules/targets/target-library.ts).
UPDATE `targets` SET `em_modified_lux` = 1000, `ez_lux` = 150, `em_wall_lux` = 150, `em_ceiling_lux` = 100, `ra` = 80, `rugl` = 19,
  `source` = 'EN 12464-1:2021, offices table (ISO/CIE 8995-1)'
  WHERE `organization_id` IS NULL AND `use_type` = 'office_writing';--> statement-breakpoint
INSERT INTO `targets` (`organization_id`, `use_type`, `name`, `em_lux`, `source_unit`, `u0_min`, `em_modified_lux`, `source`, `confidence`, `created_at`)
  SELECT NULL, 'office_filing', 'Offices: filing, copying', 300, 'lx', 0.4, 500, 'EN 12464-1:2021, offices table', 'secondary', CAST(strftime('%s', 'now') AS INTEGER) * 1000
  WHERE EXISTS (SELECT 1 FROM `targets` WHERE `organization_id` IS NULL)
    AND NOT EXISTS (SELECT 1 FROM `targets` WHERE `organization_id` IS NULL AND `use_type` = 'office_filing');
