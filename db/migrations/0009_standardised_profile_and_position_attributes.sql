ALTER TABLE `positions` ADD `instrument_type` text;--> statement-breakpoint
ALTER TABLE `positions` ADD `issuer_category` text;--> statement-breakpoint
ALTER TABLE `positions` ADD `maturity_date` text;--> statement-breakpoint
ALTER TABLE `positions` ADD `residual_maturity_years` real;--> statement-breakpoint
ALTER TABLE `positions` ADD `coupon` real;--> statement-breakpoint
ALTER TABLE `positions` ADD `next_reset_date` text;--> statement-breakpoint
ALTER TABLE `positions` ADD `modified_duration` real;--> statement-breakpoint
ALTER TABLE `positions` ADD `national_market` text;--> statement-breakpoint
ALTER TABLE `positions` ADD `commodity` text;--> statement-breakpoint
ALTER TABLE `positions` ADD `underlying` text;--> statement-breakpoint
ALTER TABLE `positions` ADD `strike` real;--> statement-breakpoint
ALTER TABLE `positions` ADD `option_type` text;--> statement-breakpoint
ALTER TABLE `capital_rule_profiles` ADD `version` integer DEFAULT 1 NOT NULL;--> statement-breakpoint
ALTER TABLE `capital_rule_profiles` ADD `regimes` text DEFAULT 'internal_models' NOT NULL;--> statement-breakpoint
ALTER TABLE `capital_rule_profiles` ADD `filed_regime` text DEFAULT 'internal_models' NOT NULL;--> statement-breakpoint
ALTER TABLE `capital_rule_profiles` ADD `standardised` text;--> statement-breakpoint
ALTER TABLE `capital_rule_profiles` ADD `show_rwa` integer DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE `capital_rule_profiles` ADD `reason` text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE `capital_rule_profiles` ADD `previous_id` text;--> statement-breakpoint
ALTER TABLE `capital_rule_profiles` ADD `created_by` text;--> statement-breakpoint
CREATE UNIQUE INDEX `capital_rule_profiles_firm_version` ON `capital_rule_profiles` (`firm_id`,`version`);