CREATE TABLE `categories` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`team_id` bigint unsigned NOT NULL,
	`revision` int NOT NULL DEFAULT 1,
	`tags` json NOT NULL,
	`notes` mediumtext NOT NULL,
	`created_by` bigint unsigned NOT NULL,
	`updated_by` bigint unsigned NOT NULL,
	`deleted_at` datetime(3),
	`deleted_by` bigint unsigned,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`parent_id` bigint unsigned,
	`name` varchar(200) NOT NULL,
	CONSTRAINT `categories_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `entry_links` (
	`team_id` bigint unsigned NOT NULL,
	`from_type` enum('mark','maker','material','category') NOT NULL,
	`from_id` bigint unsigned NOT NULL,
	`to_type` enum('mark','maker','material','category') NOT NULL,
	`to_id` bigint unsigned NOT NULL,
	CONSTRAINT `entry_links_team_id_from_type_from_id_to_type_to_id_pk` PRIMARY KEY(`team_id`,`from_type`,`from_id`,`to_type`,`to_id`)
);
--> statement-breakpoint
CREATE TABLE `entry_notes` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`team_id` bigint unsigned NOT NULL,
	`entry_type` enum('mark','maker','material','category') NOT NULL,
	`entry_id` bigint unsigned NOT NULL,
	`author_id` bigint unsigned NOT NULL,
	`body` mediumtext NOT NULL,
	`happened_on` date,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `entry_notes_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `entry_revisions` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`team_id` bigint unsigned NOT NULL,
	`entry_type` enum('mark','maker','material','category') NOT NULL,
	`entry_id` bigint unsigned NOT NULL,
	`revision` int NOT NULL,
	`action` enum('create','edit','restore') NOT NULL,
	`restored_from` int,
	`changed_fields` json NOT NULL,
	`snapshot` json NOT NULL,
	`author_id` bigint unsigned NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `entry_revisions_id` PRIMARY KEY(`id`),
	CONSTRAINT `entry_revisions_entry_unique` UNIQUE(`team_id`,`entry_type`,`entry_id`,`revision`)
);
--> statement-breakpoint
CREATE TABLE `makers` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`team_id` bigint unsigned NOT NULL,
	`revision` int NOT NULL DEFAULT 1,
	`tags` json NOT NULL,
	`notes` mediumtext NOT NULL,
	`created_by` bigint unsigned NOT NULL,
	`updated_by` bigint unsigned NOT NULL,
	`deleted_at` datetime(3),
	`deleted_by` bigint unsigned,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`name` varchar(200) NOT NULL,
	`other_names` json NOT NULL,
	`country` varchar(120) NOT NULL DEFAULT '',
	`year_from` smallint,
	`year_from_approx` boolean NOT NULL DEFAULT false,
	`year_to` smallint,
	`year_to_approx` boolean NOT NULL DEFAULT false,
	CONSTRAINT `makers_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `mark_categories` (
	`team_id` bigint unsigned NOT NULL,
	`mark_id` bigint unsigned NOT NULL,
	`category_id` bigint unsigned NOT NULL,
	CONSTRAINT `mark_categories_team_id_mark_id_category_id_pk` PRIMARY KEY(`team_id`,`mark_id`,`category_id`)
);
--> statement-breakpoint
CREATE TABLE `mark_inscriptions` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`team_id` bigint unsigned NOT NULL,
	`mark_id` bigint unsigned NOT NULL,
	`position` smallint NOT NULL,
	`text` varchar(300) NOT NULL,
	CONSTRAINT `mark_inscriptions_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `mark_lookalikes` (
	`team_id` bigint unsigned NOT NULL,
	`mark_low_id` bigint unsigned NOT NULL,
	`mark_high_id` bigint unsigned NOT NULL,
	`how_to_tell` text NOT NULL,
	CONSTRAINT `mark_lookalikes_team_id_mark_low_id_mark_high_id_pk` PRIMARY KEY(`team_id`,`mark_low_id`,`mark_high_id`)
);
--> statement-breakpoint
CREATE TABLE `mark_materials` (
	`team_id` bigint unsigned NOT NULL,
	`mark_id` bigint unsigned NOT NULL,
	`material_id` bigint unsigned NOT NULL,
	CONSTRAINT `mark_materials_team_id_mark_id_material_id_pk` PRIMARY KEY(`team_id`,`mark_id`,`material_id`)
);
--> statement-breakpoint
CREATE TABLE `marks` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`team_id` bigint unsigned NOT NULL,
	`revision` int NOT NULL DEFAULT 1,
	`tags` json NOT NULL,
	`notes` mediumtext NOT NULL,
	`created_by` bigint unsigned NOT NULL,
	`updated_by` bigint unsigned NOT NULL,
	`deleted_at` datetime(3),
	`deleted_by` bigint unsigned,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`title` varchar(200) NOT NULL,
	`maker_id` bigint unsigned,
	`mark_type` enum('printed','impressed','incised','underglaze','painted','moulded','paper_label','foil_label','other'),
	`colour` varchar(80) NOT NULL DEFAULT '',
	`position` varchar(120) NOT NULL DEFAULT '',
	`country` varchar(120) NOT NULL DEFAULT '',
	`year_from` smallint,
	`year_to` smallint,
	`date_confidence` enum('low','medium','high'),
	CONSTRAINT `marks_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `materials` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`team_id` bigint unsigned NOT NULL,
	`revision` int NOT NULL DEFAULT 1,
	`tags` json NOT NULL,
	`notes` mediumtext NOT NULL,
	`created_by` bigint unsigned NOT NULL,
	`updated_by` bigint unsigned NOT NULL,
	`deleted_at` datetime(3),
	`deleted_by` bigint unsigned,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`name` varchar(200) NOT NULL,
	`recognition` mediumtext NOT NULL,
	`checks` json NOT NULL,
	`damage` mediumtext NOT NULL,
	`cautions` mediumtext NOT NULL,
	`handbook_path` varchar(200) NOT NULL DEFAULT '',
	`sources` json NOT NULL,
	CONSTRAINT `materials_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE INDEX `categories_team_parent_idx` ON `categories` (`team_id`,`parent_id`);--> statement-breakpoint
CREATE INDEX `categories_team_name_idx` ON `categories` (`team_id`,`name`);--> statement-breakpoint
CREATE INDEX `categories_team_deleted_idx` ON `categories` (`team_id`,`deleted_at`);--> statement-breakpoint
CREATE INDEX `entry_links_team_to_idx` ON `entry_links` (`team_id`,`to_type`,`to_id`);--> statement-breakpoint
CREATE INDEX `entry_notes_team_entry_idx` ON `entry_notes` (`team_id`,`entry_type`,`entry_id`,`created_at`);--> statement-breakpoint
CREATE INDEX `makers_team_name_idx` ON `makers` (`team_id`,`name`);--> statement-breakpoint
CREATE INDEX `makers_team_deleted_idx` ON `makers` (`team_id`,`deleted_at`);--> statement-breakpoint
CREATE INDEX `mark_categories_team_category_idx` ON `mark_categories` (`team_id`,`category_id`);--> statement-breakpoint
CREATE INDEX `mark_inscriptions_team_mark_idx` ON `mark_inscriptions` (`team_id`,`mark_id`,`position`);--> statement-breakpoint
CREATE INDEX `mark_inscriptions_team_text_idx` ON `mark_inscriptions` (`team_id`,`text`);--> statement-breakpoint
CREATE INDEX `mark_lookalikes_team_high_idx` ON `mark_lookalikes` (`team_id`,`mark_high_id`);--> statement-breakpoint
CREATE INDEX `mark_materials_team_material_idx` ON `mark_materials` (`team_id`,`material_id`);--> statement-breakpoint
CREATE INDEX `marks_team_title_idx` ON `marks` (`team_id`,`title`);--> statement-breakpoint
CREATE INDEX `marks_team_maker_idx` ON `marks` (`team_id`,`maker_id`);--> statement-breakpoint
CREATE INDEX `marks_team_deleted_idx` ON `marks` (`team_id`,`deleted_at`);--> statement-breakpoint
CREATE INDEX `materials_team_name_idx` ON `materials` (`team_id`,`name`);--> statement-breakpoint
CREATE INDEX `materials_team_deleted_idx` ON `materials` (`team_id`,`deleted_at`);