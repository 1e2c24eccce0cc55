CREATE TABLE `audit_events` (
	`id` text PRIMARY KEY NOT NULL,
	`firm_id` text NOT NULL,
	`actor_id` text,
	`actor_name` text DEFAULT '' NOT NULL,
	`at` text NOT NULL,
	`action` text NOT NULL,
	`entity_type` text NOT NULL,
	`entity_id` text,
	`summary` text DEFAULT '' NOT NULL,
	`detail` text
);
--> statement-breakpoint
CREATE INDEX `audit_events_firm_at` ON `audit_events` (`firm_id`,`at`);--> statement-breakpoint
CREATE TABLE `calendar_settings` (
	`id` text PRIMARY KEY NOT NULL,
	`firm_id` text NOT NULL,
	`deadline_rule` text DEFAULT 'business-days-after' NOT NULL,
	`deadline_value` integer DEFAULT 15 NOT NULL,
	`reminder_offsets` text DEFAULT '[10,5,2,1]' NOT NULL,
	`remind_overdue` integer DEFAULT true NOT NULL,
	`auto_open_periods` integer DEFAULT true NOT NULL,
	`updated_at` text
);
--> statement-breakpoint
CREATE UNIQUE INDEX `calendar_settings_firm` ON `calendar_settings` (`firm_id`);--> statement-breakpoint
CREATE TABLE `holidays` (
	`id` text PRIMARY KEY NOT NULL,
	`firm_id` text NOT NULL,
	`date` text NOT NULL,
	`name` text DEFAULT '' NOT NULL,
	`created_at` text NOT NULL
);
--> statement-breakpoint
CREATE UNIQUE INDEX `holidays_firm_date` ON `holidays` (`firm_id`,`date`);--> statement-breakpoint
CREATE TABLE `reminder_log` (
	`id` text PRIMARY KEY NOT NULL,
	`firm_id` text NOT NULL,
	`period_id` text NOT NULL,
	`step` text NOT NULL,
	`offset_days` integer NOT NULL,
	`user_id` text NOT NULL,
	`email` text NOT NULL,
	`status` text DEFAULT 'pending' NOT NULL,
	`attempts` integer DEFAULT 0 NOT NULL,
	`last_error` text,
	`next_attempt_at` text,
	`sent_at` text,
	`created_at` text NOT NULL
);
--> statement-breakpoint
CREATE UNIQUE INDEX `reminder_log_once` ON `reminder_log` (`period_id`,`step`,`offset_days`,`user_id`);--> statement-breakpoint
CREATE TABLE `instruments` (
	`id` text PRIMARY KEY NOT NULL,
	`firm_id` text NOT NULL,
	`code` text NOT NULL,
	`name` text DEFAULT '' NOT NULL,
	`asset_class` text DEFAULT 'unknown' NOT NULL,
	`currency` text DEFAULT '' NOT NULL,
	`created_at` text NOT NULL
);
--> statement-breakpoint
CREATE UNIQUE INDEX `instruments_firm_code` ON `instruments` (`firm_id`,`code`);--> statement-breakpoint
CREATE TABLE `positions` (
	`id` text PRIMARY KEY NOT NULL,
	`firm_id` text NOT NULL,
	`period_id` text NOT NULL,
	`upload_id` text NOT NULL,
	`row_number` integer NOT NULL,
	`as_of` text NOT NULL,
	`book` text NOT NULL,
	`instrument_code` text NOT NULL,
	`instrument_name` text NOT NULL,
	`asset_class` text NOT NULL,
	`currency` text NOT NULL,
	`quantity` real NOT NULL,
	`price` real NOT NULL,
	`market_value` real NOT NULL,
	`delta_exposure` real
);
--> statement-breakpoint
CREATE INDEX `positions_firm_upload` ON `positions` (`firm_id`,`upload_id`);--> statement-breakpoint
CREATE TABLE `price_points` (
	`id` text PRIMARY KEY NOT NULL,
	`firm_id` text NOT NULL,
	`instrument_id` text NOT NULL,
	`date` text NOT NULL,
	`close` real NOT NULL,
	`upload_id` text,
	`current` integer DEFAULT true NOT NULL,
	`replaced_by_upload` text,
	`created_at` text NOT NULL
);
--> statement-breakpoint
CREATE INDEX `price_points_firm_instrument_date` ON `price_points` (`firm_id`,`instrument_id`,`date`);--> statement-breakpoint
CREATE TABLE `uploads` (
	`id` text PRIMARY KEY NOT NULL,
	`firm_id` text NOT NULL,
	`period_id` text,
	`kind` text NOT NULL,
	`file_name` text NOT NULL,
	`file_key` text NOT NULL,
	`sha256` text NOT NULL,
	`size_bytes` integer NOT NULL,
	`status` text DEFAULT 'pending' NOT NULL,
	`summary` text,
	`problems` text,
	`uploaded_by` text NOT NULL,
	`confirmed_by` text,
	`confirmed_at` text,
	`superseded_by` text,
	`created_at` text NOT NULL
);
--> statement-breakpoint
CREATE INDEX `uploads_firm_period` ON `uploads` (`firm_id`,`period_id`);--> statement-breakpoint
CREATE TABLE `filings` (
	`id` text PRIMARY KEY NOT NULL,
	`firm_id` text NOT NULL,
	`period_id` text NOT NULL,
	`run_id` text NOT NULL,
	`version` integer DEFAULT 1 NOT NULL,
	`previous_id` text,
	`status` text DEFAULT 'draft' NOT NULL,
	`content` text NOT NULL,
	`cover_note` text DEFAULT '' NOT NULL,
	`reason` text DEFAULT '' NOT NULL,
	`prepared_by` text NOT NULL,
	`submitted_by` text,
	`filed_at` text,
	`filing_reference` text,
	`created_at` text NOT NULL
);
--> statement-breakpoint
CREATE INDEX `filings_firm_period` ON `filings` (`firm_id`,`period_id`);--> statement-breakpoint
CREATE TABLE `review_comments` (
	`id` text PRIMARY KEY NOT NULL,
	`firm_id` text NOT NULL,
	`filing_id` text NOT NULL,
	`section` text NOT NULL,
	`body` text NOT NULL,
	`kind` text DEFAULT 'comment' NOT NULL,
	`author_id` text NOT NULL,
	`created_at` text NOT NULL
);
--> statement-breakpoint
CREATE TABLE `signatures` (
	`id` text PRIMARY KEY NOT NULL,
	`firm_id` text NOT NULL,
	`filing_id` text NOT NULL,
	`signer_id` text NOT NULL,
	`signer_name` text NOT NULL,
	`licence_reference` text NOT NULL,
	`content_hash` text NOT NULL,
	`signed_at` text NOT NULL,
	`superseded_at` text,
	`superseded_reason` text,
	`created_at` text NOT NULL
);
--> statement-breakpoint
CREATE TABLE `firms` (
	`id` text PRIMARY KEY NOT NULL,
	`name` text NOT NULL,
	`slug` text NOT NULL,
	`reporting_currency` text DEFAULT 'EUR' NOT NULL,
	`regulator_name` text DEFAULT '' NOT NULL,
	`licence_label` text DEFAULT 'Registration reference' NOT NULL,
	`method_co_approval` integer DEFAULT false NOT NULL,
	`created_at` text NOT NULL
);
--> statement-breakpoint
CREATE UNIQUE INDEX `firms_slug_unique` ON `firms` (`slug`);--> statement-breakpoint
CREATE TABLE `memberships` (
	`id` text PRIMARY KEY NOT NULL,
	`firm_id` text NOT NULL,
	`user_id` text NOT NULL,
	`roles` text NOT NULL,
	`active` integer DEFAULT true NOT NULL,
	`reminders_enabled` integer DEFAULT true NOT NULL,
	`deactivated_at` text,
	`created_at` text NOT NULL,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `memberships_firm_user` ON `memberships` (`firm_id`,`user_id`);--> statement-breakpoint
CREATE TABLE `sign_in_attempts` (
	`id` text PRIMARY KEY NOT NULL,
	`email` text NOT NULL,
	`address` text NOT NULL,
	`succeeded` integer NOT NULL,
	`at` text NOT NULL
);
--> statement-breakpoint
CREATE INDEX `sign_in_attempts_email_at` ON `sign_in_attempts` (`email`,`at`);--> statement-breakpoint
CREATE INDEX `sign_in_attempts_address_at` ON `sign_in_attempts` (`address`,`at`);--> statement-breakpoint
CREATE TABLE `users` (
	`id` text PRIMARY KEY NOT NULL,
	`email` text NOT NULL,
	`name` text NOT NULL,
	`password_hash` text NOT NULL,
	`active` integer DEFAULT true NOT NULL,
	`session_version` integer DEFAULT 1 NOT NULL,
	`created_at` text NOT NULL
);
--> statement-breakpoint
CREATE UNIQUE INDEX `users_email_unique` ON `users` (`email`);--> statement-breakpoint
CREATE TABLE `reporting_periods` (
	`id` text PRIMARY KEY NOT NULL,
	`firm_id` text NOT NULL,
	`period_end` text NOT NULL,
	`deadline` text NOT NULL,
	`state` text DEFAULT 'open' NOT NULL,
	`opened_by` text,
	`filed_at` text,
	`filing_reference` text,
	`created_at` text NOT NULL
);
--> statement-breakpoint
CREATE UNIQUE INDEX `reporting_periods_firm_end` ON `reporting_periods` (`firm_id`,`period_end`);--> statement-breakpoint
CREATE TABLE `capital_rule_profiles` (
	`id` text PRIMARY KEY NOT NULL,
	`firm_id` text NOT NULL,
	`name` text DEFAULT 'Default (Basel market-risk framework)' NOT NULL,
	`confidence` real DEFAULT 0.99 NOT NULL,
	`horizon_days` integer DEFAULT 10 NOT NULL,
	`averaging_days` integer DEFAULT 60 NOT NULL,
	`base_multiplier` real DEFAULT 3 NOT NULL,
	`stressed_multiplier` real DEFAULT 3 NOT NULL,
	`backtest_days` integer DEFAULT 250 NOT NULL,
	`plus_factors` text NOT NULL,
	`active` integer DEFAULT true NOT NULL,
	`created_at` text NOT NULL
);
--> statement-breakpoint
CREATE TABLE `method_statements` (
	`id` text PRIMARY KEY NOT NULL,
	`firm_id` text NOT NULL,
	`version` integer NOT NULL,
	`status` text DEFAULT 'draft' NOT NULL,
	`content` text NOT NULL,
	`rationale` text DEFAULT '' NOT NULL,
	`limitations` text DEFAULT '[]' NOT NULL,
	`evidence` text,
	`reason` text DEFAULT '' NOT NULL,
	`previous_id` text,
	`created_by` text NOT NULL,
	`approved_by` text,
	`co_approved_by` text,
	`approved_at` text,
	`created_at` text NOT NULL
);
--> statement-breakpoint
CREATE UNIQUE INDEX `method_statements_firm_version` ON `method_statements` (`firm_id`,`version`);--> statement-breakpoint
CREATE TABLE `runs` (
	`id` text PRIMARY KEY NOT NULL,
	`firm_id` text NOT NULL,
	`period_id` text NOT NULL,
	`method_statement_id` text NOT NULL,
	`positions_upload_id` text NOT NULL,
	`capital_profile_id` text,
	`status` text DEFAULT 'queued' NOT NULL,
	`stage` text DEFAULT 'queued' NOT NULL,
	`progress` real DEFAULT 0 NOT NULL,
	`input_hashes` text,
	`engine_version` text,
	`results` text,
	`error` text,
	`is_filing_run` integer DEFAULT false NOT NULL,
	`reproduces_run_id` text,
	`started_by` text NOT NULL,
	`created_at` text NOT NULL,
	`finished_at` text
);
--> statement-breakpoint
CREATE INDEX `runs_firm_period` ON `runs` (`firm_id`,`period_id`);