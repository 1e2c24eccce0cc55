-- A completed run's per-position detail, apart from its figures (lib/runs/detail.ts). Written once with the run's
-- completion and never changed or deleted, like the run's stored inputs.
CREATE TABLE `run_details` (
	`run_id` text PRIMARY KEY NOT NULL,
	`firm_id` text NOT NULL,
	`data` blob NOT NULL,
	`bytes` integer NOT NULL,
	`created_at` text NOT NULL,
	FOREIGN KEY (`run_id`) REFERENCES `runs`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`firm_id`) REFERENCES `firms`(`id`) ON UPDATE no action ON DELETE no action
);--> statement-breakpoint
CREATE TRIGGER run_details_no_update BEFORE UPDATE ON run_details
BEGIN
  SELECT RAISE(ABORT, 'the stored detail of a run cannot be changed');
END;
--> statement-breakpoint
CREATE TRIGGER run_details_no_delete BEFORE DELETE ON run_details
BEGIN
  SELECT RAISE(ABORT, 'the stored detail of a run cannot be deleted');
END;
