-- Covering indexes for the reports (server/utils/reports/sql.ts). Each report groups the items by one column and
-- status: an index that starts with team_id and that column and holds every figure the report reads gives MariaDB
-- the rows in group order from the index alone (no temporary table, no row lookups). The sold index serves the
-- price statistics and the month report's sales; the acquired and listed ones its other two streams. items is
-- defined in the ledger schema (ledger.ts), so these are written here by hand: drizzle-kit does not know them.
CREATE INDEX `items_report_category_idx` ON `items` (`team_id`, `category_id`, `status`, `acquired_on`, `sold_on`, `listed_on`, `cost_cents`, `sale_price_cents`, `shipping_charged_cents`, `net_profit_cents`);
--> statement-breakpoint
CREATE INDEX `items_report_mark_idx` ON `items` (`team_id`, `mark_id`, `status`, `acquired_on`, `sold_on`, `listed_on`, `cost_cents`, `sale_price_cents`, `shipping_charged_cents`, `net_profit_cents`);
--> statement-breakpoint
CREATE INDEX `items_report_maker_idx` ON `items` (`team_id`, `maker_id`, `status`, `acquired_on`, `sold_on`, `listed_on`, `cost_cents`, `sale_price_cents`, `shipping_charged_cents`, `net_profit_cents`);
--> statement-breakpoint
CREATE INDEX `items_report_material_idx` ON `items` (`team_id`, `material_id`, `status`, `acquired_on`, `sold_on`, `listed_on`, `cost_cents`, `sale_price_cents`, `shipping_charged_cents`, `net_profit_cents`);
--> statement-breakpoint
CREATE INDEX `items_report_store_idx` ON `items` (`team_id`, `store_id`, `status`, `acquired_on`, `sold_on`, `listed_on`, `cost_cents`, `sale_price_cents`, `shipping_charged_cents`, `net_profit_cents`);
--> statement-breakpoint
CREATE INDEX `items_report_member_idx` ON `items` (`team_id`, `sourced_by`, `status`, `acquired_on`, `sold_on`, `listed_on`, `cost_cents`, `sale_price_cents`, `shipping_charged_cents`, `net_profit_cents`);
--> statement-breakpoint
CREATE INDEX `items_report_sold_idx` ON `items` (`team_id`, `sold_on`, `status`, `acquired_on`, `listed_on`, `cost_cents`, `sale_price_cents`, `shipping_charged_cents`, `net_profit_cents`, `category_id`, `mark_id`, `maker_id`, `material_id`, `store_id`, `sourced_by`, `fee_profile_id`);
--> statement-breakpoint
CREATE INDEX `items_report_acquired_idx` ON `items` (`team_id`, `acquired_on`, `status`, `cost_cents`);
--> statement-breakpoint
CREATE INDEX `items_report_listed_idx` ON `items` (`team_id`, `listed_on`);