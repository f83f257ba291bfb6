// Report settings: the buy targets a team's owner sets for the buy check. One row per team, created on the
// first save; until then the defaults of shared/reports/buy-check.ts apply (revision 0).
// The reports' indexes on items live in migration 0007_reports_items_indexes (custom SQL): items belongs to the
// ledger schema (ledger.ts), and its table definition is not repeated here.
import { int, mysqlTable } from 'drizzle-orm/mysql-core'
import { ref, teamId, timestamps } from './columns'

export const buyTargets = mysqlTable('buy_targets', {
  teamId: teamId().primaryKey(),
  revision: int('revision').notNull().default(1),
  minProfitCents: int('min_profit_cents').notNull(),
  // Percent in basis points (10000 = 100 %).
  minRoiBp: int('min_roi_bp').notNull(),
  maxDaysToSell: int('max_days_to_sell').notNull(),
  updatedBy: ref('updated_by').notNull(),
  ...timestamps(),
})
