CREATE TABLE `fee_profiles` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`team_id` bigint unsigned NOT NULL,
	`revision` int NOT NULL DEFAULT 1,
	`name` varchar(120) NOT NULL,
	`channel` varchar(120) NOT NULL DEFAULT '',
	`percent_bp` int NOT NULL DEFAULT 0,
	`fixed_cents` bigint NOT NULL DEFAULT 0,
	`payment_percent_bp` int NOT NULL DEFAULT 0,
	`payment_fixed_cents` bigint NOT NULL DEFAULT 0,
	`default_flag` tinyint,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `fee_profiles_id` PRIMARY KEY(`id`),
	CONSTRAINT `fee_profiles_team_name_unique` UNIQUE(`team_id`,`name`),
	CONSTRAINT `fee_profiles_team_default_unique` UNIQUE(`team_id`,`default_flag`)
);
--> statement-breakpoint
CREATE TABLE `import_mappings` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`team_id` bigint unsigned NOT NULL,
	`header_key` char(64) NOT NULL,
	`headers` json NOT NULL,
	`mapping` json NOT NULL,
	`date_order` enum('mdy','dmy') NOT NULL DEFAULT 'mdy',
	`updated_by` bigint unsigned NOT NULL,
	`last_used_at` datetime(3) NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `import_mappings_id` PRIMARY KEY(`id`),
	CONSTRAINT `import_mappings_team_header_unique` UNIQUE(`team_id`,`header_key`)
);
--> statement-breakpoint
CREATE TABLE `item_status_events` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`team_id` bigint unsigned NOT NULL,
	`item_id` bigint unsigned NOT NULL,
	`from_status` enum('in_stock','listed','sold','shipped','returned','donated','written_off','kept'),
	`to_status` enum('in_stock','listed','sold','shipped','returned','donated','written_off','kept') NOT NULL,
	`happened_on` date NOT NULL,
	`changed_by` bigint unsigned NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `item_status_events_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `items` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`team_id` bigint unsigned NOT NULL,
	`revision` int NOT NULL DEFAULT 1,
	`title` varchar(200) NOT NULL,
	`status` enum('in_stock','listed','sold','shipped','returned','donated','written_off','kept') NOT NULL DEFAULT 'in_stock',
	`category_id` bigint unsigned,
	`mark_id` bigint unsigned,
	`maker_id` bigint unsigned,
	`material_id` bigint unsigned,
	`quantity` int NOT NULL DEFAULT 1,
	`condition_grade` varchar(40),
	`damage_flags` json NOT NULL,
	`damage_notes` text NOT NULL,
	`weight_grams` int,
	`box_length_mm` int,
	`box_width_mm` int,
	`box_height_mm` int,
	`trip_id` bigint unsigned,
	`store_id` bigint unsigned,
	`acquired_on` date NOT NULL,
	`cost_cents` bigint NOT NULL DEFAULT 0,
	`sourced_by` bigint unsigned,
	`listed_by` bigint unsigned,
	`listed_on` date,
	`asking_cents` bigint,
	`fee_profile_id` bigint unsigned,
	`sold_on` date,
	`shipped_on` date,
	`sale_price_cents` bigint,
	`shipping_charged_cents` bigint,
	`postage_cents` bigint,
	`supplies_cents` bigint,
	`fees_cents` bigint,
	`fees_manual` boolean NOT NULL DEFAULT false,
	`refund_cents` bigint,
	`net_profit_cents` bigint,
	`external_id` varchar(120),
	`import_key` char(64),
	`notes` text NOT NULL,
	`created_by` bigint unsigned NOT NULL,
	`updated_by` bigint unsigned NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `items_id` PRIMARY KEY(`id`),
	CONSTRAINT `items_team_import_key_unique` UNIQUE(`team_id`,`import_key`)
);
--> statement-breakpoint
CREATE TABLE `ledger_settings` (
	`team_id` bigint unsigned NOT NULL,
	`mileage_rate_cents` int NOT NULL DEFAULT 0,
	`condition_scale` json NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `ledger_settings_team_id` PRIMARY KEY(`team_id`)
);
--> statement-breakpoint
CREATE TABLE `sourcing_trips` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`team_id` bigint unsigned NOT NULL,
	`revision` int NOT NULL DEFAULT 1,
	`store_id` bigint unsigned NOT NULL,
	`trip_date` date NOT NULL,
	`bags_cents` bigint NOT NULL DEFAULT 0,
	`parking_cents` bigint NOT NULL DEFAULT 0,
	`fuel_cents` bigint NOT NULL DEFAULT 0,
	`miles_tenths` int NOT NULL DEFAULT 0,
	`mileage_rate_cents` int NOT NULL DEFAULT 0,
	`mileage_cents` bigint NOT NULL DEFAULT 0,
	`notes` text NOT NULL,
	`created_by` bigint unsigned NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `sourcing_trips_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `stores` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`team_id` bigint unsigned NOT NULL,
	`revision` int NOT NULL DEFAULT 1,
	`name` varchar(120) NOT NULL,
	`kind` enum('thrift_store','estate_sale','auction','yard_sale','online','other') NOT NULL DEFAULT 'thrift_store',
	`town` varchar(120) NOT NULL DEFAULT '',
	`notes` text NOT NULL,
	`created_by` bigint unsigned NOT NULL,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	CONSTRAINT `stores_id` PRIMARY KEY(`id`),
	CONSTRAINT `stores_team_name_unique` UNIQUE(`team_id`,`name`)
);
--> statement-breakpoint
CREATE TABLE `trip_members` (
	`team_id` bigint unsigned NOT NULL,
	`trip_id` bigint unsigned NOT NULL,
	`user_id` bigint unsigned NOT NULL,
	CONSTRAINT `trip_members_team_id_trip_id_user_id_pk` PRIMARY KEY(`team_id`,`trip_id`,`user_id`)
);
--> statement-breakpoint
CREATE INDEX `import_mappings_team_used_idx` ON `import_mappings` (`team_id`,`last_used_at`);--> statement-breakpoint
CREATE INDEX `item_status_events_team_item_idx` ON `item_status_events` (`team_id`,`item_id`,`id`);--> statement-breakpoint
CREATE INDEX `item_status_events_team_day_idx` ON `item_status_events` (`team_id`,`happened_on`);--> statement-breakpoint
CREATE INDEX `items_team_status_idx` ON `items` (`team_id`,`status`);--> statement-breakpoint
CREATE INDEX `items_team_sold_idx` ON `items` (`team_id`,`sold_on`);--> statement-breakpoint
CREATE INDEX `items_team_category_idx` ON `items` (`team_id`,`category_id`);--> statement-breakpoint
CREATE INDEX `items_team_mark_idx` ON `items` (`team_id`,`mark_id`);--> statement-breakpoint
CREATE INDEX `items_team_maker_idx` ON `items` (`team_id`,`maker_id`);--> statement-breakpoint
CREATE INDEX `items_team_trip_idx` ON `items` (`team_id`,`trip_id`);--> statement-breakpoint
CREATE INDEX `items_team_store_idx` ON `items` (`team_id`,`store_id`);--> statement-breakpoint
CREATE INDEX `items_team_acquired_idx` ON `items` (`team_id`,`acquired_on`);--> statement-breakpoint
CREATE INDEX `items_team_sourced_idx` ON `items` (`team_id`,`sourced_by`);--> statement-breakpoint
CREATE INDEX `sourcing_trips_team_date_idx` ON `sourcing_trips` (`team_id`,`trip_date`);--> statement-breakpoint
CREATE INDEX `sourcing_trips_team_store_idx` ON `sourcing_trips` (`team_id`,`store_id`,`trip_date`);--> statement-breakpoint
CREATE INDEX `stores_team_kind_idx` ON `stores` (`team_id`,`kind`);--> statement-breakpoint
CREATE INDEX `trip_members_team_user_idx` ON `trip_members` (`team_id`,`user_id`);