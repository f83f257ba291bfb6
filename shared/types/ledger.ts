// What the ledger API sends and accepts, for pages and composables. Inputs are inferred from the zod schemas
// the server validates with; rows are inferred from the database schema. Money in cents, dates yyyy-mm-dd.
import type { z } from 'zod'
import type {
  calculatorSchema, feeProfileCreateSchema, feeProfilePatchSchema, itemCreateSchema, itemListQuery, itemPatchSchema,
  itemSaleSchema, itemStatusSchema, ledgerSettingsPatchSchema, storeCreateSchema, storePatchSchema, tripCreateSchema, tripPatchSchema,
} from '../schemas/ledger'
import type { DamageFlag, ItemStatus, StoreKind, TripFigures } from '../ledger/item-rules'
import type { LedgerCurrency } from '../ledger/currencies'
import type { feeProfiles, itemStatusEvents, items, sourcingTrips, stores } from '../../server/database/schema/ledger'
import type { EntryPhoto } from '../photos'

export type { DamageFlag, ItemStatus, StoreKind, TripFigures }

export type LedgerStoreCreateInput = z.input<typeof storeCreateSchema>
export type LedgerStorePatchInput = z.input<typeof storePatchSchema>
export type LedgerTripCreateInput = z.input<typeof tripCreateSchema>
export type LedgerTripPatchInput = z.input<typeof tripPatchSchema>
export type LedgerFeeProfileCreateInput = z.input<typeof feeProfileCreateSchema>
export type LedgerFeeProfilePatchInput = z.input<typeof feeProfilePatchSchema>
export type LedgerItemCreateInput = z.input<typeof itemCreateSchema>
export type LedgerItemPatchInput = z.input<typeof itemPatchSchema>
export type LedgerItemListQuery = z.input<typeof itemListQuery>
export type LedgerItemStatusInput = z.input<typeof itemStatusSchema>
export type LedgerItemSaleInput = z.input<typeof itemSaleSchema>
export type LedgerCalculatorInput = z.input<typeof calculatorSchema>
export type LedgerSettingsPatchInput = z.input<typeof ledgerSettingsPatchSchema>

export type LedgerStoreRow = typeof stores.$inferSelect
export type LedgerTripRow = typeof sourcingTrips.$inferSelect
export type LedgerFeeProfileRow = typeof feeProfiles.$inferSelect
export type LedgerItemRow = typeof items.$inferSelect
export type LedgerStatusEventRow = typeof itemStatusEvents.$inferSelect

export interface LedgerPage<T> { items: T[], total: number, page: number, pageSize: number }

/** `currency`: the ISO 4217 code every amount of the team is in (shared/ledger/currencies.ts). */
export interface LedgerSettings { mileageRateCents: number, conditionScale: string[], currency: LedgerCurrency }

export interface LedgerStore {
  id: number
  revision: number
  name: string
  kind: StoreKind
  town: string
  notes: string
  createdBy: number
  createdAt: string
  updatedAt: string
}

export interface LedgerTrip extends TripFigures {
  id: number
  revision: number
  storeId: number
  storeName: string
  tripDate: string
  memberIds: number[]
  bagsCents: number
  parkingCents: number
  fuelCents: number
  miles: number
  mileageRateCents: number
  mileageCents: number
  notes: string
  createdBy: number
  createdAt: string
  updatedAt: string
}

export interface LedgerTripTotals { trips: number, totalSpentCents: number, revenueCents: number, netSoFarCents: number }

export interface LedgerFeeProfile {
  id: number
  revision: number
  name: string
  channel: string
  percentBp: number
  fixedCents: number
  paymentPercentBp: number
  paymentFixedCents: number
  isDefault: boolean
}

/** The stored fields of an item with its computed figures (what every write recomputes). */
export interface LedgerItemFields {
  id: number
  revision: number
  title: string
  status: ItemStatus
  categoryId: number | null
  markId: number | null
  makerId: number | null
  materialId: number | null
  quantity: number
  condition: string | null
  damage: { flags: DamageFlag[], notes: string }
  weightGrams: number | null
  box: { lengthMm: number, widthMm: number, heightMm: number } | null
  tripId: number | null
  storeId: number | null
  acquiredOn: string
  costCents: number
  sourcedBy: number | null
  listedBy: number | null
  listedOn: string | null
  askingCents: number | null
  feeProfileId: number | null
  soldOn: string | null
  shippedOn: string | null
  salePriceCents: number | null
  shippingChargedCents: number | null
  postageCents: number | null
  suppliesCents: number | null
  feesCents: number | null
  feesManual: boolean
  refundCents: number | null
  /** Computed by the server with shared/ledger: null while the item is in stock or listed. */
  netProfitCents: number | null
  /** Percent, not rounded; null without an outcome or at a cost of 0. */
  roi: number | null
  daysToSell: number | null
  externalId: string | null
  notes: string
  createdBy: number
  updatedBy: number
  createdAt: string
  updatedAt: string
}

/** An entry an item links to, by name; `deleted` when it is in the team's deleted list (the link stays). */
export interface LedgerLinkedEntry { id: number, name: string, deleted: boolean }

/** The names behind an item's ids, so a page shows them without asking for each entry. */
export interface LedgerItemLinks {
  /** `path`: the names from the top category down to this one ("Kitchenware", "Jugs"). */
  category: (LedgerLinkedEntry & { path: string[] }) | null
  mark: LedgerLinkedEntry | null
  /** The item's maker; without one, the maker of its mark (`fromMark`). */
  maker: (LedgerLinkedEntry & { fromMark: boolean }) | null
  material: LedgerLinkedEntry | null
  store: { id: number, name: string } | null
  trip: { id: number, tripDate: string, storeName: string } | null
  feeProfile: { id: number, name: string } | null
  sourcedBy: { id: number, name: string } | null
  listedBy: { id: number, name: string } | null
}

/** An item as the list and the item routes send it: its fields and the names of what it links to. */
export interface LedgerItem extends LedgerItemFields { links: LedgerItemLinks }

/** One item (GET /items/:id): also its photos, in gallery order, with the URLs the photos route serves. */
export interface LedgerItemDetail extends LedgerItem { photos: EntryPhoto[] }

/** Sums over every row the filters select (not just the page), computed in SQL. */
export interface LedgerItemTotals { items: number, costCents: number, revenueCents: number, netProfitCents: number }

export interface LedgerStatusEvent { id: number, from: ItemStatus | null, to: ItemStatus, happenedOn: string, changedBy: { id: number, name: string }, changedAt: string }

export interface LedgerImportError { row: number, column: string | null, field: string | null, message: string }

export interface LedgerImportReport {
  dryRun: boolean
  rows: number
  validRows: number
  /** Rows already in the team from an earlier import of the same file (same key): they are not added again. */
  alreadyImported: number
  /** Rows added (or, on a dry run, that would be added). */
  added: number
  storesCreated: string[]
  errors: LedgerImportError[]
  errorCount: number
  totals: { costCents: number, revenueCents: number, netProfitCents: number }
  mapping: Record<string, string>
  /** Where the time went, in milliseconds: reading and checking the rows, looking up earlier imports, writing. */
  timings: { readAndCheckMs: number, keyLookupMs: number, writeMs: number }
}
