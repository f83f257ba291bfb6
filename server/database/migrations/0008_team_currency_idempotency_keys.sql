CREATE TABLE `idempotency_keys` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`team_id` bigint unsigned NOT NULL,
	`user_id` bigint unsigned NOT NULL,
	`idem_key` varchar(100) NOT NULL,
	`route` varchar(255) NOT NULL,
	`request_hash` char(64) NOT NULL,
	`status_code` int,
	`response` json,
	`created_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
	`expires_at` datetime(3) NOT NULL,
	CONSTRAINT `idempotency_keys_id` PRIMARY KEY(`id`),
	CONSTRAINT `idempotency_keys_team_user_key_unique` UNIQUE(`team_id`,`user_id`,`idem_key`)
);
--> statement-breakpoint
ALTER TABLE `ledger_settings` ADD `currency` char(3) DEFAULT 'USD' NOT NULL;--> statement-breakpoint
CREATE INDEX `idempotency_keys_expires_idx` ON `idempotency_keys` (`expires_at`);