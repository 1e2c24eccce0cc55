ALTER TABLE `uploads` ADD `file_url` text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE `uploads` ADD `options` text;--> statement-breakpoint
ALTER TABLE `uploads` ADD `row_count` integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE `uploads` ADD `error_count` integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE `uploads` ADD `warning_count` integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE `uploads` ADD `cancelled_at` text;