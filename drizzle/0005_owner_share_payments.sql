CREATE TABLE `owner_approvals` (
	`id` text PRIMARY KEY NOT NULL,
	`shop_id` text NOT NULL,
	`job_id` text NOT NULL,
	`option_id` text NOT NULL,
	`revision_id` text NOT NULL,
	`checksum` text NOT NULL,
	`option_title` text NOT NULL,
	`price_cents` integer NOT NULL,
	`deposit_cents` integer NOT NULL,
	`approver_name` text NOT NULL,
	`share_link_id` text,
	`created_at` integer DEFAULT (unixepoch('subsec') * 1000) NOT NULL,
	FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`job_id`) REFERENCES `jobs`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`option_id`) REFERENCES `owner_options`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`revision_id`) REFERENCES `sheet_revisions`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`share_link_id`) REFERENCES `share_links`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `owner_approvals_job_id_unique` ON `owner_approvals` (`job_id`);--> statement-breakpoint
CREATE TABLE `owner_options` (
	`id` text PRIMARY KEY NOT NULL,
	`shop_id` text NOT NULL,
	`job_id` text NOT NULL,
	`sheet_id` text NOT NULL,
	`revision_id` text NOT NULL,
	`checksum` text NOT NULL,
	`title` text NOT NULL,
	`owner_note` text DEFAULT '' NOT NULL,
	`price_cents` integer NOT NULL,
	`deposit_cents` integer NOT NULL,
	`lead_time_days` integer NOT NULL,
	`position` integer NOT NULL,
	`version` integer DEFAULT 1 NOT NULL,
	`created_by` text,
	`created_at` integer DEFAULT (unixepoch('subsec') * 1000) NOT NULL,
	`updated_at` integer DEFAULT (unixepoch('subsec') * 1000) NOT NULL,
	FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`job_id`) REFERENCES `jobs`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`sheet_id`) REFERENCES `spec_sheets`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`revision_id`) REFERENCES `sheet_revisions`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `owner_options_job_idx` ON `owner_options` (`job_id`,`position`);--> statement-breakpoint
CREATE TABLE `owner_pages` (
	`job_id` text PRIMARY KEY NOT NULL,
	`shop_id` text NOT NULL,
	`what_failed` text DEFAULT '' NOT NULL,
	`version` integer DEFAULT 1 NOT NULL,
	`updated_at` integer DEFAULT (unixepoch('subsec') * 1000) NOT NULL,
	FOREIGN KEY (`job_id`) REFERENCES `jobs`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE TABLE `payment_events` (
	`id` text PRIMARY KEY NOT NULL,
	`type` text NOT NULL,
	`created_at` integer DEFAULT (unixepoch('subsec') * 1000) NOT NULL
);
--> statement-breakpoint
CREATE TABLE `payments` (
	`id` text PRIMARY KEY NOT NULL,
	`shop_id` text NOT NULL,
	`job_id` text NOT NULL,
	`approval_id` text NOT NULL,
	`checkout_session_id` text NOT NULL,
	`amount_cents` integer NOT NULL,
	`currency` text NOT NULL,
	`state` text DEFAULT 'open' NOT NULL,
	`paid_at` integer,
	`created_at` integer DEFAULT (unixepoch('subsec') * 1000) NOT NULL,
	FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`job_id`) REFERENCES `jobs`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`approval_id`) REFERENCES `owner_approvals`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `payments_checkout_session_id_unique` ON `payments` (`checkout_session_id`);--> statement-breakpoint
CREATE INDEX `payments_job_idx` ON `payments` (`job_id`,`created_at`);--> statement-breakpoint
CREATE TABLE `share_links` (
	`id` text PRIMARY KEY NOT NULL,
	`shop_id` text NOT NULL,
	`job_id` text NOT NULL,
	`token_hash` text NOT NULL,
	`email` text,
	`expires_at` integer NOT NULL,
	`revoked_at` integer,
	`last_opened_at` integer,
	`created_by` text,
	`created_at` integer DEFAULT (unixepoch('subsec') * 1000) NOT NULL,
	FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`job_id`) REFERENCES `jobs`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `share_links_token_hash_unique` ON `share_links` (`token_hash`);--> statement-breakpoint
CREATE INDEX `share_links_job_idx` ON `share_links` (`job_id`,`created_at`);