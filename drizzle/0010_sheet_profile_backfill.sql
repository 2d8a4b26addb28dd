-- Bind each existing sheet to the job profile it was started from: the profile named in its create audit row when that
-- profile is still on the job, else the job profile whose label revision 1 carries (the oldest such, when several).
UPDATE `spec_sheets` SET `profile_id` = coalesce(
  (SELECT p.`id` FROM `audit_log` a JOIN `cam_profiles` p ON p.`id` = json_extract(a.`detail`, '$.profileId')
    WHERE a.`entity` = 'sheet' AND a.`action` = 'create' AND a.`entity_id` = `spec_sheets`.`id`
      AND p.`job_id` = `spec_sheets`.`job_id` AND p.`shop_id` = `spec_sheets`.`shop_id`
    ORDER BY a.`id` LIMIT 1),
  (SELECT p.`id` FROM `sheet_revisions` r JOIN `cam_profiles` p ON p.`label` = r.`label`
    WHERE r.`sheet_id` = `spec_sheets`.`id` AND r.`number` = 1
      AND p.`job_id` = `spec_sheets`.`job_id` AND p.`shop_id` = `spec_sheets`.`shop_id`
    ORDER BY p.`created_at`, p.`id` LIMIT 1)
);
--> statement-breakpoint
-- One sheet per option: where two sheets matched the same profile, the oldest keeps it and the others stay unbound
-- (they keep every revision and order; compare starts no sheet for them and never writes into them).
UPDATE `spec_sheets` SET `profile_id` = NULL
WHERE `profile_id` IS NOT NULL AND EXISTS (
  SELECT 1 FROM `spec_sheets` older
  WHERE older.`job_id` = `spec_sheets`.`job_id` AND older.`profile_id` = `spec_sheets`.`profile_id`
    AND (older.`created_at` < `spec_sheets`.`created_at` OR (older.`created_at` = `spec_sheets`.`created_at` AND older.`id` < `spec_sheets`.`id`))
);
