CREATE TABLE `ledger_versions` (
	`team_id` bigint unsigned NOT NULL,
	`version` bigint unsigned NOT NULL DEFAULT 0,
	`changed_at` datetime(6) NOT NULL DEFAULT CURRENT_TIMESTAMP(6),
	CONSTRAINT `ledger_versions_team_id` PRIMARY KEY(`team_id`)
);
