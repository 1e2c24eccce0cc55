CREATE TABLE `run_inputs` (
	`run_id` text PRIMARY KEY NOT NULL,
	`firm_id` text NOT NULL,
	`data` blob NOT NULL,
	`bytes` integer NOT NULL,
	`created_at` text NOT NULL
);
--> statement-breakpoint
ALTER TABLE `runs` ADD `heartbeat_at` text;--> statement-breakpoint
CREATE UNIQUE INDEX `runs_one_active_per_period` ON `runs` (`firm_id`,`period_id`) WHERE status in ('queued', 'running');--> statement-breakpoint
CREATE UNIQUE INDEX `runs_one_filing_run_per_period` ON `runs` (`firm_id`,`period_id`) WHERE is_filing_run = 1;