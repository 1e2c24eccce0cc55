CREATE TABLE `account_requests` (
	`id` text PRIMARY KEY NOT NULL,
	`kind` text NOT NULL,
	`key` text NOT NULL,
	`at` text NOT NULL
);
--> statement-breakpoint
CREATE INDEX `account_requests_kind_key_at` ON `account_requests` (`kind`,`key`,`at`);--> statement-breakpoint
CREATE TABLE `account_tokens` (
	`id` text PRIMARY KEY NOT NULL,
	`user_id` text NOT NULL,
	`firm_id` text,
	`purpose` text NOT NULL,
	`token_hash` text NOT NULL,
	`expires_at` text NOT NULL,
	`used_at` text,
	`created_by` text,
	`created_at` text NOT NULL
);
--> statement-breakpoint
CREATE UNIQUE INDEX `account_tokens_hash` ON `account_tokens` (`token_hash`);--> statement-breakpoint
CREATE INDEX `account_tokens_user` ON `account_tokens` (`user_id`,`purpose`);--> statement-breakpoint
CREATE TABLE `install_steps` (
	`id` text PRIMARY KEY NOT NULL,
	`at` text NOT NULL,
	`detail` text
);
--> statement-breakpoint
CREATE TABLE `quality_confirmations` (
	`id` text PRIMARY KEY NOT NULL,
	`firm_id` text NOT NULL,
	`period_id` text NOT NULL,
	`check` text NOT NULL,
	`instrument` text NOT NULL,
	`item_key` text NOT NULL,
	`reason` text NOT NULL,
	`confirmed_by` text NOT NULL,
	`confirmed_by_name` text NOT NULL,
	`confirmed_at` text NOT NULL
);
--> statement-breakpoint
CREATE UNIQUE INDEX `quality_confirmations_item` ON `quality_confirmations` (`firm_id`,`period_id`,`check`,`instrument`,`item_key`);--> statement-breakpoint
ALTER TABLE `firms` ADD `method_single_approval_reason` text DEFAULT '' NOT NULL;