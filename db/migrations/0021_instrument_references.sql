-- price_points.instrument_id refers to instruments.id, and instruments.firm_id to firms.id (in place, keeping the
-- tables' triggers). A price confirmation adds the instruments it does not know before staging their closes, marked
-- pending_upload until its last step; readers skip pending instruments (see DEVELOPERS.md, schema and migrations).
ALTER TABLE `instruments` ADD `pending_upload` text REFERENCES uploads(id);--> statement-breakpoint
ALTER TABLE `instruments` ALTER COLUMN "firm_id" TO "firm_id" text NOT NULL REFERENCES firms(id) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `price_points` ALTER COLUMN "instrument_id" TO "instrument_id" text NOT NULL REFERENCES instruments(id) ON DELETE no action ON UPDATE no action;