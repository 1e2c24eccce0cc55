ALTER TABLE `positions` ADD `next_reset_years` real;--> statement-breakpoint
ALTER TABLE `positions` ADD `notional` real;--> statement-breakpoint
ALTER TABLE `positions` ADD `underlying_maturity_years` real;--> statement-breakpoint
ALTER TABLE `positions` ADD `underlying_price` real;