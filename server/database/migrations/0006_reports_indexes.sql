CREATE TABLE `buy_targets` (
	`team_id` bigint unsigned NOT NULL,
	`revision` int NOT NULL DEFAULT 1,
	`min_profit_cents` int NOT NULL,
	`min_roi_bp` int NOT NULL,
	`max_days_to_sell` int NOT NULL,
	`updated_by` bigint unsigned NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `buy_targets_team_id` PRIMARY KEY(`team_id`)
);
