-- Foreign keys where a row refers to another row (see DEVELOPERS.md, schema and migrations). libSQL changes a column
-- in place (ALTER COLUMN … TO …), which keeps the table and its triggers, except for a primary key: run_inputs.run_id
-- is its primary key, so run_inputs is rebuilt here and 0020_foreign_keys_triggers_again.sql re-creates its triggers.
ALTER TABLE `positions` ALTER COLUMN "firm_id" TO "firm_id" text NOT NULL REFERENCES firms(id) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `positions` ALTER COLUMN "period_id" TO "period_id" text NOT NULL REFERENCES reporting_periods(id) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `positions` ALTER COLUMN "upload_id" TO "upload_id" text NOT NULL REFERENCES uploads(id) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `price_points` ALTER COLUMN "firm_id" TO "firm_id" text NOT NULL REFERENCES firms(id) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `price_points` ALTER COLUMN "upload_id" TO "upload_id" text REFERENCES uploads(id) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `upload_parts` ALTER COLUMN "firm_id" TO "firm_id" text NOT NULL REFERENCES firms(id) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `upload_parts` ALTER COLUMN "upload_id" TO "upload_id" text NOT NULL REFERENCES uploads(id) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `uploads` ALTER COLUMN "firm_id" TO "firm_id" text NOT NULL REFERENCES firms(id) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `uploads` ALTER COLUMN "period_id" TO "period_id" text REFERENCES reporting_periods(id) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `filings` ALTER COLUMN "firm_id" TO "firm_id" text NOT NULL REFERENCES firms(id) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `filings` ALTER COLUMN "period_id" TO "period_id" text NOT NULL REFERENCES reporting_periods(id) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `filings` ALTER COLUMN "run_id" TO "run_id" text NOT NULL REFERENCES runs(id) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `review_comments` ALTER COLUMN "firm_id" TO "firm_id" text NOT NULL REFERENCES firms(id) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `review_comments` ALTER COLUMN "filing_id" TO "filing_id" text NOT NULL REFERENCES filings(id) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `signatures` ALTER COLUMN "firm_id" TO "firm_id" text NOT NULL REFERENCES firms(id) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `signatures` ALTER COLUMN "filing_id" TO "filing_id" text NOT NULL REFERENCES filings(id) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `memberships` ALTER COLUMN "firm_id" TO "firm_id" text NOT NULL REFERENCES firms(id) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE TABLE `__new_run_inputs` (
	`run_id` text PRIMARY KEY NOT NULL,
	`firm_id` text NOT NULL,
	`data` blob NOT NULL,
	`bytes` integer NOT NULL,
	`created_at` text NOT NULL,
	FOREIGN KEY (`run_id`) REFERENCES `runs`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`firm_id`) REFERENCES `firms`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
INSERT INTO `__new_run_inputs`("run_id", "firm_id", "data", "bytes", "created_at") SELECT "run_id", "firm_id", "data", "bytes", "created_at" FROM `run_inputs`;--> statement-breakpoint
DROP TABLE `run_inputs`;--> statement-breakpoint
ALTER TABLE `__new_run_inputs` RENAME TO `run_inputs`;--> statement-breakpoint
ALTER TABLE `runs` ALTER COLUMN "firm_id" TO "firm_id" text NOT NULL REFERENCES firms(id) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `runs` ALTER COLUMN "period_id" TO "period_id" text NOT NULL REFERENCES reporting_periods(id) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `runs` ALTER COLUMN "method_statement_id" TO "method_statement_id" text NOT NULL REFERENCES method_statements(id) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `runs` ALTER COLUMN "positions_upload_id" TO "positions_upload_id" text NOT NULL REFERENCES uploads(id) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `runs` ALTER COLUMN "capital_profile_id" TO "capital_profile_id" text REFERENCES capital_rule_profiles(id) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `pack_files` ALTER COLUMN "firm_id" TO "firm_id" text NOT NULL REFERENCES firms(id) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `pack_files` ALTER COLUMN "filing_id" TO "filing_id" text NOT NULL REFERENCES filings(id) ON DELETE no action ON UPDATE no action;