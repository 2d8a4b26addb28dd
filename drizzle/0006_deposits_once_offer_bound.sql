PRAGMA foreign_keys=OFF;--> statement-breakpoint
CREATE TABLE `__new_payments` (
	`id` text PRIMARY KEY NOT NULL,
	`shop_id` text NOT NULL,
	`job_id` text NOT NULL,
	`approval_id` text NOT NULL,
	`checkout_session_id` text,
	`checkout_url` text,
	`amount_cents` integer NOT NULL,
	`currency` text NOT NULL,
	`state` text DEFAULT 'open' NOT NULL,
	`payment_intent_id` text,
	`refund_id` text,
	`paid_at` integer,
	`created_at` integer DEFAULT (unixepoch('subsec') * 1000) NOT NULL,
	FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`job_id`) REFERENCES `jobs`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`approval_id`) REFERENCES `owner_approvals`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
INSERT INTO `__new_payments`("id", "shop_id", "job_id", "approval_id", "checkout_session_id", "amount_cents", "currency", "state", "paid_at", "created_at") SELECT "id", "shop_id", "job_id", "approval_id", "checkout_session_id", "amount_cents", "currency", "state", "paid_at", "created_at" FROM `payments`;--> statement-breakpoint
UPDATE `__new_payments` SET `state` = 'expired' WHERE `state` = 'open' AND `rowid` NOT IN (SELECT max(`rowid`) FROM `__new_payments` WHERE `state` = 'open' GROUP BY `approval_id`);--> statement-breakpoint
DROP TABLE `payments`;--> statement-breakpoint
ALTER TABLE `__new_payments` RENAME TO `payments`;--> statement-breakpoint
PRAGMA foreign_keys=ON;--> statement-breakpoint
CREATE UNIQUE INDEX `payments_checkout_session_id_unique` ON `payments` (`checkout_session_id`);--> statement-breakpoint
CREATE INDEX `payments_job_idx` ON `payments` (`job_id`,`created_at`);--> statement-breakpoint
CREATE UNIQUE INDEX `payments_one_open_per_approval_idx` ON `payments` (`approval_id`) WHERE state = 'open';--> statement-breakpoint
ALTER TABLE `owner_approvals` ADD `currency` text DEFAULT 'usd' NOT NULL;--> statement-breakpoint
ALTER TABLE `owner_approvals` ADD `lead_time_days` integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE `owner_approvals` ADD `offer_checksum` text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE `payment_events` ADD `outcome` text;