CREATE TABLE `case_events` (
	`id` text PRIMARY KEY NOT NULL,
	`shop_id` text NOT NULL,
	`case_id` text NOT NULL,
	`seq` integer NOT NULL,
	`client_event_id` text NOT NULL,
	`kind` text NOT NULL,
	`payload` text NOT NULL,
	`ranking` text NOT NULL,
	`edition_id` text NOT NULL,
	`actor_user_id` text,
	`api_key_id` text,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`case_id`) REFERENCES `cases`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`edition_id`) REFERENCES `rulebook_editions`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`actor_user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`api_key_id`) REFERENCES `api_keys`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `case_events_case_seq_unique` ON `case_events` (`case_id`,`seq`);--> statement-breakpoint
CREATE UNIQUE INDEX `case_events_case_client_id_unique` ON `case_events` (`case_id`,`client_event_id`);--> statement-breakpoint
CREATE TABLE `vehicles` (
	`id` text PRIMARY KEY NOT NULL,
	`shop_id` text NOT NULL,
	`vin` text,
	`plate` text,
	`year` integer,
	`make` text,
	`model` text,
	`engine` text,
	`created_at` integer DEFAULT (unixepoch()) NOT NULL,
	FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `vehicles_shop_vin_unique` ON `vehicles` (`shop_id`,`vin`);--> statement-breakpoint
CREATE INDEX `vehicles_shop_plate_idx` ON `vehicles` (`shop_id`,`plate`);--> statement-breakpoint
ALTER TABLE `cases` ADD `vehicle_id` text REFERENCES vehicles(id);--> statement-breakpoint
ALTER TABLE `cases` ADD `odometer_value` real;--> statement-breakpoint
ALTER TABLE `cases` ADD `odometer_unit` text;--> statement-breakpoint
ALTER TABLE `cases` ADD `contact` text;--> statement-breakpoint
ALTER TABLE `cases` ADD `assigned_to` text REFERENCES users(id);--> statement-breakpoint
ALTER TABLE `cases` ADD `last_seq` integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE `cases` ADD `top_causes` text DEFAULT '[]' NOT NULL;--> statement-breakpoint
ALTER TABLE `cases` ADD `updated_at` integer;--> statement-breakpoint
CREATE INDEX `cases_shop_status_idx` ON `cases` (`shop_id`,`status`,`created_at`);--> statement-breakpoint
CREATE INDEX `cases_vehicle_idx` ON `cases` (`vehicle_id`);--> statement-breakpoint
ALTER TABLE `shops` ADD `slug` text;--> statement-breakpoint
CREATE UNIQUE INDEX `shops_slug_unique` ON `shops` (`slug`);