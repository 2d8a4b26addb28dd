ALTER TABLE `sheet_revisions` ADD `core_notes` text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE `spec_sheets` ADD `profile_id` text REFERENCES cam_profiles(id) ON DELETE set null;