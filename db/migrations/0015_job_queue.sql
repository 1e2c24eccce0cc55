CREATE TABLE `jobs` (
	`id` text PRIMARY KEY NOT NULL,
	`firm_id` text,
	`kind` text NOT NULL,
	`payload` text NOT NULL,
	`state` text DEFAULT 'queued' NOT NULL,
	`attempts` integer DEFAULT 0 NOT NULL,
	`max_attempts` integer DEFAULT 1 NOT NULL,
	`run_after` text NOT NULL,
	`lease_owner` text,
	`lease_expires_at` text,
	`heartbeat_at` text,
	`stage` text,
	`progress` real,
	`result` text,
	`error` text,
	`dedupe_key` text,
	`created_at` text NOT NULL,
	`started_at` text,
	`finished_at` text
);
--> statement-breakpoint
CREATE INDEX `jobs_claim` ON `jobs` (`state`,`run_after`);--> statement-breakpoint
CREATE INDEX `jobs_lease` ON `jobs` (`state`,`lease_expires_at`);--> statement-breakpoint
CREATE INDEX `jobs_dedupe_key` ON `jobs` (`dedupe_key`);--> statement-breakpoint
CREATE UNIQUE INDEX `jobs_one_active_per_key` ON `jobs` (`dedupe_key`) WHERE state in ('queued', 'running') and dedupe_key is not null;