-- The changes found when a run's stored closes were compared with one state of the firm's price history, kept so
-- that every web process reads them instead of comparing again (lib/data/run-freshness.ts).
CREATE TABLE `run_price_checks` (
	`run_id` text NOT NULL,
	`firm_id` text NOT NULL,
	`price_state` text NOT NULL,
	`changes` text NOT NULL,
	`created_at` text NOT NULL,
	PRIMARY KEY(`run_id`, `price_state`),
	FOREIGN KEY (`run_id`) REFERENCES `runs`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`firm_id`) REFERENCES `firms`(`id`) ON UPDATE no action ON DELETE no action
);
