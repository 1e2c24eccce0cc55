ALTER TABLE `signatures` ADD `attestation` text DEFAULT '' NOT NULL;--> statement-breakpoint
CREATE INDEX `signatures_firm_filing` ON `signatures` (`firm_id`,`filing_id`);--> statement-breakpoint
CREATE UNIQUE INDEX `signatures_one_current_per_filing` ON `signatures` (`filing_id`) WHERE superseded_at is null;--> statement-breakpoint
CREATE UNIQUE INDEX `filings_firm_period_version` ON `filings` (`firm_id`,`period_id`,`version`);--> statement-breakpoint
CREATE UNIQUE INDEX `filings_one_current_per_period` ON `filings` (`firm_id`,`period_id`) WHERE status <> 'superseded';--> statement-breakpoint
CREATE INDEX `review_comments_firm_filing` ON `review_comments` (`firm_id`,`filing_id`);