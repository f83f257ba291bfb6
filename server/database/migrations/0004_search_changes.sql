CREATE TABLE `search_changes` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`team_id` bigint unsigned NOT NULL,
	`entity_type` varchar(32) NOT NULL,
	`entity_id` bigint unsigned NOT NULL,
	`changed_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `search_changes_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE INDEX `search_changes_team_id_idx` ON `search_changes` (`team_id`,`id`);--> statement-breakpoint
CREATE INDEX `search_changes_changed_idx` ON `search_changes` (`changed_at`);