CREATE TABLE `grind_orders` (
	`id` text PRIMARY KEY NOT NULL,
	`repair_shop_id` text NOT NULL,
	`grinder_shop_id` text NOT NULL,
	`sheet_id` text NOT NULL,
	`revision_id` text NOT NULL,
	`checksum` text NOT NULL,
	`stage` text DEFAULT 'sent' NOT NULL,
	`quote` text,
	`shipping` text,
	`version` integer DEFAULT 1 NOT NULL,
	`issued_by` text,
	`created_at` integer DEFAULT (unixepoch('subsec') * 1000) NOT NULL,
	`updated_at` integer DEFAULT (unixepoch('subsec') * 1000) NOT NULL,
	FOREIGN KEY (`repair_shop_id`) REFERENCES `shops`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`grinder_shop_id`) REFERENCES `shops`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`sheet_id`) REFERENCES `spec_sheets`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`revision_id`) REFERENCES `sheet_revisions`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`issued_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `grind_orders_revision_id_unique` ON `grind_orders` (`revision_id`);--> statement-breakpoint
CREATE INDEX `grind_orders_grinder_idx` ON `grind_orders` (`grinder_shop_id`,`created_at`);--> statement-breakpoint
CREATE INDEX `grind_orders_sheet_idx` ON `grind_orders` (`sheet_id`,`created_at`);--> statement-breakpoint
CREATE TABLE `order_messages` (
	`id` text PRIMARY KEY NOT NULL,
	`order_id` text NOT NULL,
	`author_user_id` text,
	`author_shop_id` text NOT NULL,
	`body` text NOT NULL,
	`created_at` integer DEFAULT (unixepoch('subsec') * 1000) NOT NULL,
	FOREIGN KEY (`order_id`) REFERENCES `grind_orders`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`author_user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null,
	FOREIGN KEY (`author_shop_id`) REFERENCES `shops`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `order_messages_order_idx` ON `order_messages` (`order_id`,`created_at`);--> statement-breakpoint
CREATE TABLE `outbox` (
	`id` text PRIMARY KEY NOT NULL,
	`to` text NOT NULL,
	`subject` text NOT NULL,
	`text` text NOT NULL,
	`html` text NOT NULL,
	`created_at` integer DEFAULT (unixepoch('subsec') * 1000) NOT NULL
);
--> statement-breakpoint
CREATE INDEX `outbox_created_idx` ON `outbox` (`created_at`);