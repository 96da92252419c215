PRAGMA foreign_keys=OFF;--> statement-breakpoint
CREATE TABLE `__new_cases` (
	`id` text PRIMARY KEY NOT NULL,
	`shop_id` text NOT NULL,
	`edition_id` text NOT NULL,
	`status` text DEFAULT 'waiting' NOT NULL,
	`source` text NOT NULL,
	`created_by` text,
	`api_key_id` text,
	`vehicle_id` text,
	`odometer_value` real,
	`odometer_unit` text,
	`complaint` text,
	`contact` text,
	`assigned_to` text,
	`last_seq` integer DEFAULT 0 NOT NULL,
	`top_causes` text DEFAULT '[]' NOT NULL,
	`created_at` integer DEFAULT (unixepoch()) NOT NULL,
	`updated_at` integer DEFAULT (unixepoch()) NOT NULL,
	FOREIGN KEY (`shop_id`) REFERENCES `shops`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`edition_id`) REFERENCES `rulebook_editions`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`api_key_id`) REFERENCES `api_keys`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`vehicle_id`) REFERENCES `vehicles`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`assigned_to`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
INSERT INTO `__new_cases`("id", "shop_id", "edition_id", "status", "source", "created_by", "api_key_id", "vehicle_id", "odometer_value", "odometer_unit", "complaint", "contact", "assigned_to", "last_seq", "top_causes", "created_at", "updated_at") SELECT "id", "shop_id", "edition_id", "status", "source", "created_by", "api_key_id", "vehicle_id", "odometer_value", "odometer_unit", "complaint", "contact", "assigned_to", "last_seq", "top_causes", "created_at", "updated_at" FROM `cases`;--> statement-breakpoint
DROP TABLE `cases`;--> statement-breakpoint
ALTER TABLE `__new_cases` RENAME TO `cases`;--> statement-breakpoint
PRAGMA foreign_keys=ON;--> statement-breakpoint
CREATE INDEX `cases_shop_idx` ON `cases` (`shop_id`,`created_at`);--> statement-breakpoint
CREATE INDEX `cases_shop_status_idx` ON `cases` (`shop_id`,`status`,`created_at`);--> statement-breakpoint
CREATE INDEX `cases_vehicle_idx` ON `cases` (`vehicle_id`);