CREATE TABLE `upload_parts` (
	`id` text PRIMARY KEY NOT NULL,
	`firm_id` text NOT NULL,
	`upload_id` text NOT NULL,
	`part` text NOT NULL,
	`seq` integer NOT NULL,
	`items` text NOT NULL
);
--> statement-breakpoint
CREATE UNIQUE INDEX `upload_parts_upload_part_seq` ON `upload_parts` (`upload_id`,`part`,`seq`);--> statement-breakpoint
ALTER TABLE `price_points` ADD `staged` integer DEFAULT false NOT NULL;--> statement-breakpoint
CREATE INDEX `price_points_staged` ON `price_points` (`upload_id`) WHERE "price_points"."staged" = 1;