DROP INDEX `owner_approvals_job_id_unique`;--> statement-breakpoint
ALTER TABLE `owner_approvals` ADD `withdrawn_at` integer;--> statement-breakpoint
ALTER TABLE `owner_approvals` ADD `withdrawn_reason` text;--> statement-breakpoint
CREATE UNIQUE INDEX `owner_approvals_one_live_per_job_idx` ON `owner_approvals` (`job_id`) WHERE withdrawn_at is null;--> statement-breakpoint
CREATE INDEX `owner_approvals_job_idx` ON `owner_approvals` (`job_id`,`created_at`);--> statement-breakpoint
ALTER TABLE `grind_orders` ADD `firm_by` text;--> statement-breakpoint
ALTER TABLE `grind_orders` ADD `firm_at` integer;--> statement-breakpoint
ALTER TABLE `grind_orders` ADD `firm_reason` text;--> statement-breakpoint
UPDATE `grind_orders` SET `firm_by` = 'owner', `firm_at` = `updated_at`
  WHERE `revision_id` IN (SELECT `revision_id` FROM `owner_approvals` WHERE `withdrawn_at` IS NULL);--> statement-breakpoint
UPDATE `grind_orders` SET `firm_by` = 'builder', `firm_at` = `updated_at`,
  `firm_reason` = 'Under way before firm orders were told apart from requests for a quote'
  WHERE `firm_by` IS NULL AND `stage` IN ('grinding', 'shipped', 'received', 'installed');
