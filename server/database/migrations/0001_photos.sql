CREATE TABLE `photos` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`team_id` bigint unsigned NOT NULL,
	`entity_type` enum('mark','maker','item'),
	`entity_id` bigint unsigned,
	`position` int NOT NULL DEFAULT 0,
	`display_key` varchar(255) NOT NULL,
	`thumb_key` varchar(255) NOT NULL,
	`content_type` varchar(64) NOT NULL,
	`width` int NOT NULL,
	`height` int NOT NULL,
	`thumb_width` int NOT NULL,
	`thumb_height` int NOT NULL,
	`bytes` int NOT NULL,
	`original_bytes` int NOT NULL,
	`uploaded_by` bigint unsigned NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `photos_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE INDEX `photos_team_entity_idx` ON `photos` (`team_id`,`entity_type`,`entity_id`,`position`);--> statement-breakpoint
CREATE INDEX `photos_team_created_idx` ON `photos` (`team_id`,`created_at`);