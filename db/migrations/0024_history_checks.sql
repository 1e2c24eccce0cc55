-- A run start's history check of one positions upload against one state of the firm's price history, kept so that
-- a start answers without counting a big book's history again (lib/data/runs.ts keptHistoryAssessment).
CREATE TABLE `history_checks` (
	`upload_id` text NOT NULL,
	`firm_id` text NOT NULL,
	`period_end` text NOT NULL,
	`min_history` integer NOT NULL,
	`price_state` text NOT NULL,
	`assessment` text NOT NULL,
	`created_at` text NOT NULL,
	PRIMARY KEY(`upload_id`, `period_end`, `min_history`, `price_state`),
	FOREIGN KEY (`upload_id`) REFERENCES `uploads`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`firm_id`) REFERENCES `firms`(`id`) ON UPDATE no action ON DELETE no action
);
