CREATE TABLE `data_quality_reports` (
	`id` text PRIMARY KEY NOT NULL,
	`firm_id` text NOT NULL,
	`period_id` text NOT NULL,
	`inputs_key` text NOT NULL,
	`upload_id` text,
	`file_name` text,
	`position_count` integer DEFAULT 0 NOT NULL,
	`report` text NOT NULL,
	`computed_at` text NOT NULL
);
--> statement-breakpoint
CREATE UNIQUE INDEX `data_quality_reports_firm_period` ON `data_quality_reports` (`firm_id`,`period_id`);--> statement-breakpoint
CREATE TABLE `pack_files` (
	`id` text PRIMARY KEY NOT NULL,
	`firm_id` text NOT NULL,
	`filing_id` text NOT NULL,
	`version` integer NOT NULL,
	`state` text NOT NULL,
	`format` text NOT NULL,
	`content_key` text NOT NULL,
	`file_name` text NOT NULL,
	`sha256` text NOT NULL,
	`size_bytes` integer NOT NULL,
	`bytes` blob NOT NULL,
	`created_at` text NOT NULL
);
--> statement-breakpoint
CREATE UNIQUE INDEX `pack_files_one_per_content` ON `pack_files` (`filing_id`,`version`,`state`,`format`,`content_key`);--> statement-breakpoint
CREATE INDEX `pack_files_firm_filing` ON `pack_files` (`firm_id`,`filing_id`);