CREATE TABLE `signup_requests` (
	`id` text PRIMARY KEY NOT NULL,
	`email` text NOT NULL,
	`shop_name` text NOT NULL,
	`name` text NOT NULL,
	`password_hash` text NOT NULL,
	`token_hash` text NOT NULL,
	`expires_at` integer NOT NULL,
	`used_at` integer,
	`created_at` integer DEFAULT (unixepoch()) NOT NULL
);
--> statement-breakpoint
CREATE UNIQUE INDEX `signup_requests_token_unique` ON `signup_requests` (`token_hash`);