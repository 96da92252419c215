-- Moves the cases saved before the timeline existed onto the new model, losing nothing:
-- their vehicle details become vehicle rows (one per VIN per shop), the odometer is kept in
-- km, and their answers and first ranking become each case's first event. They had never been
-- taken by a technician, so they wait in the queue.
INSERT OR IGNORE INTO `vehicles` (`id`, `shop_id`, `vin`, `plate`, `year`, `make`, `model`, `engine`, `created_at`)
SELECT 'v' || `id`, `shop_id`,
	upper(trim(json_extract(`vehicle`, '$.vin'))),
	NULL,
	json_extract(`vehicle`, '$.year'),
	json_extract(`vehicle`, '$.make'),
	json_extract(`vehicle`, '$.model'),
	json_extract(`vehicle`, '$.engine'),
	`created_at`
FROM `cases`
WHERE `vehicle` IS NOT NULL
	AND coalesce(json_extract(`vehicle`, '$.vin'), json_extract(`vehicle`, '$.year'),
		json_extract(`vehicle`, '$.make'), json_extract(`vehicle`, '$.model'),
		json_extract(`vehicle`, '$.engine')) IS NOT NULL
ORDER BY `created_at`, `id`;
--> statement-breakpoint
UPDATE `cases` SET `vehicle_id` = coalesce(
	(SELECT v.`id` FROM `vehicles` v WHERE v.`shop_id` = `cases`.`shop_id`
		AND v.`vin` = upper(trim(json_extract(`cases`.`vehicle`, '$.vin')))),
	(SELECT v.`id` FROM `vehicles` v WHERE v.`id` = 'v' || `cases`.`id`)
)
WHERE `vehicle` IS NOT NULL;
--> statement-breakpoint
UPDATE `cases` SET
	`odometer_value` = json_extract(`vehicle`, '$.odometerKm'),
	`odometer_unit` = CASE WHEN json_extract(`vehicle`, '$.odometerKm') IS NULL THEN NULL ELSE 'km' END
WHERE `vehicle` IS NOT NULL;
--> statement-breakpoint
INSERT INTO `case_events` (`id`, `shop_id`, `case_id`, `seq`, `client_event_id`, `kind`, `payload`, `ranking`, `edition_id`, `actor_user_id`, `api_key_id`, `created_at`)
SELECT 'e' || `id`, `shop_id`, `id`, 1, 'opened-' || `id`, 'case_opened',
	json_object(
		'observations', json(coalesce(`observations`, '{}')),
		'unknown', json(coalesce(`unknown`, '[]')),
		'complaint', `complaint`
	),
	coalesce(json_extract(`result`, '$.causes'), json('[]')),
	`edition_id`, `created_by`, `api_key_id`, `created_at` * 1000
FROM `cases`;
--> statement-breakpoint
UPDATE `cases` SET
	`last_seq` = 1,
	`top_causes` = coalesce(
		(SELECT json_group_array(json(t.value)) FROM
			(SELECT value FROM json_each(json_extract(`cases`.`result`, '$.causes')) ORDER BY key LIMIT 3) t),
		'[]'),
	`status` = CASE WHEN `status` = 'open' THEN 'waiting' ELSE `status` END,
	`updated_at` = `created_at`;
