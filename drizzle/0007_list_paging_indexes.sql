DROP INDEX `grind_orders_grinder_idx`;--> statement-breakpoint
CREATE INDEX `grind_orders_grinder_created_id_idx` ON `grind_orders` (`grinder_shop_id`,`created_at`,`id`);--> statement-breakpoint
DROP INDEX `jobs_shop_updated_idx`;--> statement-breakpoint
CREATE INDEX `jobs_shop_updated_id_idx` ON `jobs` (`shop_id`,`updated_at`,`id`);--> statement-breakpoint
CREATE INDEX `jobs_shop_created_idx` ON `jobs` (`shop_id`,`created_at`);--> statement-breakpoint
CREATE INDEX `outbox_to_created_idx` ON `outbox` (`to`,`created_at`,`id`);--> statement-breakpoint
CREATE INDEX `share_links_shop_email_idx` ON `share_links` (`shop_id`,`email`,`created_at`);