ALTER TABLE `outbox` ADD `shop_id` text REFERENCES shops(id) ON DELETE set null;--> statement-breakpoint
ALTER TABLE `outbox` ADD `status` text DEFAULT 'kept' NOT NULL;--> statement-breakpoint
ALTER TABLE `outbox` ADD `attempts` integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE `outbox` ADD `next_attempt_at` integer;--> statement-breakpoint
ALTER TABLE `outbox` ADD `claimed_until` integer;--> statement-breakpoint
ALTER TABLE `outbox` ADD `last_error` text;--> statement-breakpoint
ALTER TABLE `outbox` ADD `sent_at` integer;--> statement-breakpoint
CREATE INDEX `outbox_due_idx` ON `outbox` (`status`,`next_attempt_at`);--> statement-breakpoint
CREATE INDEX `outbox_shop_status_idx` ON `outbox` (`shop_id`,`status`,`created_at`);