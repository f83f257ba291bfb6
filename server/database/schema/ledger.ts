// The ledger: stores, sourcing trips, items with their sale outcomes, status history, fee profiles, import
// mappings and the team's ledger settings. Money is integer cents (int: up to 21 million dollars a row),
// calendar dates are DATE columns, times UTC. Every index starts with team_id so queries stay in one team.
import { bigint, boolean, char, date, index, int, json, mysqlEnum, mysqlTable, primaryKey, text, tinyint, uniqueIndex, varchar } from 'drizzle-orm/mysql-core'
import { createdAt, id, ref, teamId, teamVersionColumns, timestamps, utcDatetime } from './columns'
import { ITEM_STATUSES, STORE_KINDS } from '../../../shared/ledger/item-rules'
import type { DamageFlag } from '../../../shared/ledger/item-rules'

const day = (name: string) => date(name, { mode: 'string' })
const cents = (name: string) => bigint(name, { mode: 'number' })

// One row per team, created on first use with the defaults.
export const ledgerSettings = mysqlTable('ledger_settings', {
  teamId: teamId().primaryKey(),
  // The team's rate for miles driven on a sourcing trip, in cents per mile.
  mileageRateCents: int('mileage_rate_cents').notNull().default(0),
  // Best grade first; DEFAULT_CONDITION_SCALE until the team changes it.
  conditionScale: json('condition_scale').$type<string[]>().notNull(),
  // ISO 4217 code the team's amounts are in (shared/ledger/currencies.ts lists the ones with cents).
  currency: char('currency', { length: 3 }).notNull().default('USD'),
  ...timestamps(),
})

export const stores = mysqlTable('stores', {
  id: id(),
  teamId: teamId(),
  revision: int('revision').notNull().default(1),
  name: varchar('name', { length: 120 }).notNull(),
  kind: mysqlEnum('kind', STORE_KINDS).notNull().default('thrift_store'),
  town: varchar('town', { length: 120 }).notNull().default(''),
  notes: text('notes').notNull(),
  createdBy: ref('created_by').notNull(),
  ...timestamps(),
}, t => [
  uniqueIndex('stores_team_name_unique').on(t.teamId, t.name),
  index('stores_team_kind_idx').on(t.teamId, t.kind),
])

export const sourcingTrips = mysqlTable('sourcing_trips', {
  id: id(),
  teamId: teamId(),
  revision: int('revision').notNull().default(1),
  storeId: ref('store_id').notNull(),
  tripDate: day('trip_date').notNull(),
  bagsCents: cents('bags_cents').notNull().default(0),
  parkingCents: cents('parking_cents').notNull().default(0),
  fuelCents: cents('fuel_cents').notNull().default(0),
  milesTenths: int('miles_tenths').notNull().default(0),
  // The team's rate on the day the trip was recorded: later rate changes do not rewrite old trips.
  mileageRateCents: int('mileage_rate_cents').notNull().default(0),
  mileageCents: cents('mileage_cents').notNull().default(0),
  notes: text('notes').notNull(),
  createdBy: ref('created_by').notNull(),
  ...timestamps(),
}, t => [
  index('sourcing_trips_team_date_idx').on(t.teamId, t.tripDate),
  index('sourcing_trips_team_store_idx').on(t.teamId, t.storeId, t.tripDate),
])

export const tripMembers = mysqlTable('trip_members', {
  teamId: teamId(),
  tripId: ref('trip_id').notNull(),
  userId: ref('user_id').notNull(),
}, t => [
  primaryKey({ columns: [t.teamId, t.tripId, t.userId] }),
  index('trip_members_team_user_idx').on(t.teamId, t.userId),
])

export const feeProfiles = mysqlTable('fee_profiles', {
  id: id(),
  teamId: teamId(),
  revision: int('revision').notNull().default(1),
  name: varchar('name', { length: 120 }).notNull(),
  channel: varchar('channel', { length: 120 }).notNull().default(''),
  percentBp: int('percent_bp').notNull().default(0),
  fixedCents: cents('fixed_cents').notNull().default(0),
  paymentPercentBp: int('payment_percent_bp').notNull().default(0),
  paymentFixedCents: cents('payment_fixed_cents').notNull().default(0),
  // 1 on the team's default profile, NULL on the others: the unique index allows one 1 per team
  // (NULLs never collide), so "at most one default" holds in the database itself.
  defaultFlag: tinyint('default_flag'),
  ...timestamps(),
}, t => [
  uniqueIndex('fee_profiles_team_name_unique').on(t.teamId, t.name),
  uniqueIndex('fee_profiles_team_default_unique').on(t.teamId, t.defaultFlag),
])

export const items = mysqlTable('items', {
  id: id(),
  teamId: teamId(),
  revision: int('revision').notNull().default(1),
  title: varchar('title', { length: 200 }).notNull(),
  status: mysqlEnum('status', ITEM_STATUSES).notNull().default('in_stock'),
  categoryId: ref('category_id'),
  markId: ref('mark_id'),
  makerId: ref('maker_id'),
  materialId: ref('material_id'),
  quantity: int('quantity').notNull().default(1),
  condition: varchar('condition_grade', { length: 40 }),
  damageFlags: json('damage_flags').$type<DamageFlag[]>().notNull(),
  damageNotes: text('damage_notes').notNull(),
  weightGrams: int('weight_grams'),
  boxLengthMm: int('box_length_mm'),
  boxWidthMm: int('box_width_mm'),
  boxHeightMm: int('box_height_mm'),
  tripId: ref('trip_id'),
  storeId: ref('store_id'),
  acquiredOn: day('acquired_on').notNull(),
  costCents: cents('cost_cents').notNull().default(0),
  sourcedBy: ref('sourced_by'),
  listedBy: ref('listed_by'),
  listedOn: day('listed_on'),
  askingCents: cents('asking_cents'),
  feeProfileId: ref('fee_profile_id'),
  soldOn: day('sold_on'),
  shippedOn: day('shipped_on'),
  salePriceCents: cents('sale_price_cents'),
  shippingChargedCents: cents('shipping_charged_cents'),
  postageCents: cents('postage_cents'),
  suppliesCents: cents('supplies_cents'),
  feesCents: cents('fees_cents'),
  feesManual: boolean('fees_manual').notNull().default(false),
  refundCents: cents('refund_cents'),
  // Filled by the server with shared/ledger (itemNetProfitCents) on every write, so lists can SUM it in SQL.
  netProfitCents: cents('net_profit_cents'),
  externalId: varchar('external_id', { length: 120 }),
  // SHA-256 of the import row (its external id, or its mapped values): importing a file twice adds nothing twice.
  importKey: char('import_key', { length: 64 }),
  notes: text('notes').notNull(),
  createdBy: ref('created_by').notNull(),
  updatedBy: ref('updated_by').notNull(),
  ...timestamps(),
}, t => [
  index('items_team_status_idx').on(t.teamId, t.status),
  index('items_team_sold_idx').on(t.teamId, t.soldOn),
  index('items_team_category_idx').on(t.teamId, t.categoryId),
  index('items_team_mark_idx').on(t.teamId, t.markId),
  index('items_team_maker_idx').on(t.teamId, t.makerId),
  index('items_team_trip_idx').on(t.teamId, t.tripId),
  index('items_team_store_idx').on(t.teamId, t.storeId),
  index('items_team_acquired_idx').on(t.teamId, t.acquiredOn),
  index('items_team_sourced_idx').on(t.teamId, t.sourcedBy),
  uniqueIndex('items_team_import_key_unique').on(t.teamId, t.importKey),
])

// Every status change of an item: who, when, from what to what (from is NULL when the item was created).
export const itemStatusEvents = mysqlTable('item_status_events', {
  id: id(),
  teamId: teamId(),
  itemId: ref('item_id').notNull(),
  fromStatus: mysqlEnum('from_status', ITEM_STATUSES),
  toStatus: mysqlEnum('to_status', ITEM_STATUSES).notNull(),
  happenedOn: day('happened_on').notNull(),
  changedBy: ref('changed_by').notNull(),
  changedAt: createdAt(),
}, t => [
  index('item_status_events_team_item_idx').on(t.teamId, t.itemId, t.id),
  index('item_status_events_team_day_idx').on(t.teamId, t.happenedOn),
])

// Column mappings remembered per team, keyed by the file's header row, so the next export of the same
// spreadsheet maps itself.
export const importMappings = mysqlTable('import_mappings', {
  id: id(),
  teamId: teamId(),
  headerKey: char('header_key', { length: 64 }).notNull(),
  headers: json('headers').$type<string[]>().notNull(),
  mapping: json('mapping').$type<Record<string, string>>().notNull(),
  dateOrder: mysqlEnum('date_order', ['mdy', 'dmy']).notNull().default('mdy'),
  updatedBy: ref('updated_by').notNull(),
  lastUsedAt: utcDatetime('last_used_at').notNull(),
  ...timestamps(),
}, t => [
  uniqueIndex('import_mappings_team_header_unique').on(t.teamId, t.headerKey),
  index('import_mappings_team_used_idx').on(t.teamId, t.lastUsedAt),
])

// The team's ledger version: moved on inside every transaction that writes items (server/utils/ledger/versions.ts),
// so the reports can reuse figures while it stands (server/utils/reports/cache.ts).
export const ledgerVersions = mysqlTable('ledger_versions', teamVersionColumns())
