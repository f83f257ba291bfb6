// Seeds the demo team's ledger: eight invented stores around the invented town of Hollowbrook, 120 sourcing
// trips over the two years before the seed day, and about 1,600 items linked to the demo categories and
// marks, with their sales, fees, postage and status history. Deterministic (a seeded generator: the same
// items on every machine, dated back from the seed day) and written in multi-row batches. Runs outside
// Nitro: plain imports only; the arithmetic is shared/ledger's.
import { and, eq } from 'drizzle-orm'
import type { MySqlTable } from 'drizzle-orm/mysql-core'
import * as schema from '../schema'
import type { DbOrTx } from '../../utils/db'
import { mulberry32, type Rand } from './demo-reference/marks'
import { computeFees, type FeeProfile } from '../../../shared/ledger/fees'
import { estimatePostage } from '../../../shared/ledger/postage'
import {
  checkItemConsistency, DEFAULT_CONDITION_SCALE, itemNetProfitCents, tripMileageCents,
  type DamageFlag, type ItemFigures, type ItemStatus, type StoreKind,
} from '../../../shared/ledger/item-rules'

const SEED = 20260301
const BATCH = 500
const DAY_MS = 86_400_000
export const DEMO_MILEAGE_RATE_CENTS = 62 // the team's own rate per mile (invented)

export const DEMO_STORES: { name: string, kind: StoreKind, town: string, notes: string, weight: number }[] = [
  { name: 'Second Chapter Thrift', kind: 'thrift_store', town: 'Hollowbrook', notes: 'Half-price tags on the first Saturday of the month. Housewares in the back left.', weight: 5 },
  { name: 'Mill Street Mission Store', kind: 'thrift_store', town: 'Hollowbrook', notes: 'Restocks glass on Tuesday mornings. Cash or card.', weight: 4 },
  { name: 'Bellwether Hospice Resale', kind: 'thrift_store', town: 'Hollowbrook', notes: 'Priced a little higher, but they pull the good pottery for a front shelf.', weight: 3 },
  { name: 'Orchard Lane Estate Sales', kind: 'estate_sale', town: 'Hollowbrook', notes: 'Numbers handed out at 7:30; day two is half off after noon.', weight: 2 },
  { name: 'Copperfield Auction Barn', kind: 'auction', town: 'Wrenfield', notes: 'Thursday night box-lot auctions, 10 % buyer\'s premium (already in our costs).', weight: 1.5 },
  { name: 'Hollowbrook Church Rummage', kind: 'yard_sale', town: 'Hollowbrook', notes: 'Spring and autumn only. Bag sale on the last hour.', weight: 1 },
  { name: 'Tansy Hill Flea Market', kind: 'other', town: 'Tansy Hill', notes: 'Outdoor, second Sunday. Bring small bills.', weight: 1.5 },
  { name: 'Saltmarsh Online Lots', kind: 'online', town: '', notes: 'Mixed lots bought online and shipped to us: shipping is in the cost.', weight: 1 },
]

// Invented fee profiles: not any real channel's schedule.
export const DEMO_FEE_PROFILES: (FeeProfile & { name: string, channel: string, isDefault: boolean, inPerson: boolean, share: number })[] = [
  { name: 'Lanternpost standard', channel: 'Lanternpost', percentBp: 1325, fixedCents: 30, paymentPercentBp: 0, paymentFixedCents: 0, isDefault: true, inPerson: false, share: 0.55 },
  { name: 'Gleaner\'s Row', channel: 'Gleaner\'s Row', percentBp: 1000, fixedCents: 0, paymentPercentBp: 290, paymentFixedCents: 30, isDefault: false, inPerson: false, share: 0.3 },
  { name: 'Saturday table (cash)', channel: 'Hollowbrook market table', percentBp: 0, fixedCents: 0, paymentPercentBp: 0, paymentFixedCents: 0, isDefault: false, inPerson: true, share: 0.15 },
]

interface Shape { nouns: string[], grams: [number, number], sideCm: [number, number], setOf?: [number, number] }

// What each demo category's pieces are like, by category name (categories.ts).
const SHAPES: Record<string, Shape> = {
  'Vases': { nouns: ['vase', 'bud vase', 'footed vase', 'pillow vase'], grams: [250, 1400], sideCm: [10, 30] },
  'Planters': { nouns: ['planter', 'figural planter', 'wall pocket'], grams: [200, 1200], sideCm: [9, 24] },
  'Figurines': { nouns: ['figurine', 'bird figurine', 'dog figurine', 'shelf sitter'], grams: [80, 500], sideCm: [6, 18] },
  'Dinnerware': { nouns: ['gravy boat', 'covered vegetable dish', 'platter', 'dinner plates', 'teacups and saucers'], grams: [300, 2400], sideCm: [15, 38], setOf: [2, 8] },
  'Milk glass': { nouns: ['hobnail bowl', 'vase', 'compote', 'candy dish'], grams: [250, 1200], sideCm: [10, 25] },
  'Uranium glass': { nouns: ['candy dish', 'tumbler', 'sherbet cups', 'relish dish'], grams: [150, 900], sideCm: [8, 22], setOf: [2, 6] },
  'Pressed glass': { nouns: ['relish dish', 'goblets', 'butter dish', 'cake stand'], grams: [200, 1800], sideCm: [10, 30], setOf: [2, 6] },
  'Art glass': { nouns: ['paperweight', 'bowl', 'vase', 'dish'], grams: [200, 1500], sideCm: [8, 28] },
  'Bakeware': { nouns: ['casserole dish', 'pie plate', 'loaf pan', 'mixing bowls'], grams: [500, 2500], sideCm: [18, 35], setOf: [2, 4] },
  'Canisters': { nouns: ['canister set', 'cookie jar', 'flour canister'], grams: [600, 3000], sideCm: [15, 32], setOf: [3, 4] },
  'Mugs': { nouns: ['mug', 'mugs', 'coffee mugs'], grams: [250, 1500], sideCm: [10, 22], setOf: [2, 6] },
  'Serving': { nouns: ['serving bowl', 'serving platter', 'chip and dip set', 'pitcher'], grams: [400, 2200], sideCm: [15, 38] },
  'Wall decor': { nouns: ['wall plaque', 'wall pocket', 'framed tile'], grams: [200, 1500], sideCm: [15, 40] },
  'Candle holders': { nouns: ['candle holders', 'candlesticks', 'taper holders'], grams: [150, 900], sideCm: [8, 25], setOf: [2, 2] },
  'Chalkware figures': { nouns: ['chalkware dog', 'chalkware parrot', 'carnival figure'], grams: [200, 1200], sideCm: [10, 30] },
  'Resin figures': { nouns: ['resin figure', 'garden gnome', 'resin angel'], grams: [150, 1200], sideCm: [8, 28] },
  'Carved wood': { nouns: ['carved bird', 'carved bear', 'carved bowl', 'carved duck decoy'], grams: [150, 1500], sideCm: [8, 35] },
  'Tin toys': { nouns: ['wind-up toy', 'tin truck', 'tin spinning top'], grams: [100, 700], sideCm: [8, 25] },
  'Dolls': { nouns: ['doll', 'composition doll', 'cloth doll'], grams: [150, 900], sideCm: [15, 45] },
  'Board games': { nouns: ['board game', 'puzzle', 'card game'], grams: [300, 1500], sideCm: [20, 45] },
}
const FALLBACK_SHAPE: Shape = { nouns: ['piece'], grams: [150, 1500], sideCm: [8, 30] }

const LOOKS = ['Green matte', 'Blue drip-glaze', 'Floral', 'Hand-painted', 'Gold-trimmed', 'Speckled', 'Pastel', 'Embossed', 'Hobnail',
  'Cream and brown', 'Rose-pattern', 'Wheat-pattern', 'Turquoise', 'Amber', 'Yellow', 'Striped', 'Scalloped', 'Woodland', 'Ribbed', 'Petite']

const DAMAGE_NOTES: Partial<Record<DamageFlag, string[]>> = {
  chip: ['Small flake on the foot ring, only seen from below.', 'Tiny chip to the rim, smooth to the touch.'],
  hairline: ['Short hairline from the rim, stable, does not ring dull.'],
  crazing: ['Light crazing all over the glaze, no staining.'],
  worn_gilding: ['Gold trim worn on the handle.'],
  worn_paint: ['Paint rubbed on the high points.'],
  repair: ['Old glued repair to one ear, well done.'],
  stain: ['Faint mineral ring inside, may wash out.'],
  missing_part: ['Lid missing.'],
}

const pick = <T>(r: Rand, list: readonly T[]): T => list[Math.floor(r() * list.length)]!
const int = (r: Rand, lo: number, hi: number) => lo + Math.floor(r() * (hi - lo + 1))
const between = (r: Rand, lo: number, hi: number) => lo + r() * (hi - lo)
function weighted<T>(r: Rand, list: readonly T[], weightOf: (item: T) => number): T {
  const total = list.reduce((sum, item) => sum + weightOf(item), 0)
  let x = r() * total
  for (const item of list) {
    x -= weightOf(item)
    if (x <= 0) return item
  }
  return list[list.length - 1]!
}
/** A log-normal draw (Box–Muller) with the given median and spread. */
function logNormal(r: Rand, median: number, sigma: number): number {
  const z = Math.sqrt(-2 * Math.log(1 - r())) * Math.cos(2 * Math.PI * r())
  return median * Math.exp(sigma * z)
}
const roundTo = (cents: number, step: number) => Math.max(step, Math.round(cents / step) * step)
const isoDay = (time: number) => new Date(time).toISOString().slice(0, 10)

async function insertBatches(db: DbOrTx, table: MySqlTable, rows: Record<string, unknown>[], withIds: boolean): Promise<number[]> {
  const ids: number[] = []
  for (let i = 0; i < rows.length; i += BATCH) {
    const query = db.insert(table).values(rows.slice(i, i + BATCH) as never)
    if (withIds) ids.push(...(await query.$returningId() as { id: number }[]).map(r => r.id))
    else await query
  }
  return ids
}

export interface DemoLedgerOptions {
  /** Members who go on sourcing trips and add items (owner, editor, contributor). */
  sourcers: number[]
  /** The seed day (UTC, yyyy-mm-dd); trips run over the two years before it. Defaults to today. */
  today?: string
}

/** The demo reference the items link to: leaf categories and marks with their categories and materials. */
export interface DemoLedgerReference {
  categories: { id: number, name: string }[]
  marks: { id: number, makerId: number | null, categoryIds: number[], materialIds: number[] }[]
}

async function loadReference(db: DbOrTx, teamId: number): Promise<DemoLedgerReference> {
  const [categories, marks, markCategories, markMaterials] = await Promise.all([
    db.select({ id: schema.categories.id, name: schema.categories.name, parentId: schema.categories.parentId }).from(schema.categories).where(eq(schema.categories.teamId, teamId)),
    db.select({ id: schema.marks.id, makerId: schema.marks.makerId }).from(schema.marks).where(eq(schema.marks.teamId, teamId)),
    db.select().from(schema.markCategories).where(eq(schema.markCategories.teamId, teamId)),
    db.select().from(schema.markMaterials).where(and(eq(schema.markMaterials.teamId, teamId))),
  ])
  // Items sit in leaf categories (Vases, Mugs ...), not in the top-level ones.
  const parents = new Set(categories.map(c => c.parentId).filter((id): id is number => id !== null))
  const leaves = categories.filter(c => !parents.has(c.id))
  const leafIds = new Set(leaves.map(c => c.id))
  return {
    categories: leaves.sort((a, b) => a.id - b.id),
    marks: marks.sort((a, b) => a.id - b.id).map(m => ({
      id: m.id, makerId: m.makerId,
      categoryIds: markCategories.filter(c => c.markId === m.id && leafIds.has(c.categoryId)).map(c => c.categoryId).sort((a, b) => a - b),
      materialIds: markMaterials.filter(c => c.markId === m.id).map(c => c.materialId).sort((a, b) => a - b),
    })),
  }
}

type ItemInsert = typeof schema.items.$inferInsert
type TripInsert = typeof schema.sourcingTrips.$inferInsert

/** A planned item: its row, with the trip, store and fee profile as indexes into the plan's lists. */
export type DemoPlannedItem = Omit<ItemInsert, 'teamId' | 'tripId' | 'storeId' | 'feeProfileId'> & {
  tripIndex: number
  storeIndex: number
  profileIndex: number | null
  events: { from: ItemStatus | null, to: ItemStatus, on: string, by: number }[]
}
export interface DemoPlannedTrip { storeIndex: number, members: number[], row: Omit<TripInsert, 'teamId' | 'storeId'> }
export interface DemoLedgerPlan { trips: DemoPlannedTrip[], items: DemoPlannedItem[] }

export interface DemoLedgerSummary { stores: number, trips: number, items: number, events: number }

/**
 * The whole demo ledger as data, without a database: the same reference, members and day give the same
 * plan. Stores and fee profiles are DEMO_STORES and DEMO_FEE_PROFILES, in order.
 */
export function planDemoLedger(reference: DemoLedgerReference, options: { sourcers: number[], today: string }): DemoLedgerPlan {
  if (!options.sourcers.length) throw new Error('The demo ledger needs at least one member who sources.')
  if (!reference.categories.length) throw new Error('Seed the demo reference (categories and marks) before the ledger.')
  const r = mulberry32(SEED)
  const today = Date.parse(`${options.today}T00:00:00Z`)

  // 120 trips, spread over the two years before the seed day, oldest first.
  const tripCount = 120
  const trips: DemoPlannedTrip[] = Array.from({ length: tripCount }, (_, n) => {
    const storeIndex = DEMO_STORES.indexOf(weighted(r, DEMO_STORES, s => s.weight))
    const store = DEMO_STORES[storeIndex]!
    const daysBack = Math.round(730 - (n + r()) * (727 / tripCount))
    const crew = options.sourcers.filter(() => r() < 0.5)
    const members = crew.length ? crew : [pick(r, options.sourcers)]
    const online = store.kind === 'online'
    const miles = online ? 0 : int(r, 30, 420) // tenths of a mile
    const byFuel = !online && r() < 0.25
    return {
      storeIndex, members,
      row: {
        tripDate: isoDay(today - daysBack * DAY_MS),
        bagsCents: store.kind === 'thrift_store' && r() < 0.3 ? 100 : 0,
        parkingCents: store.kind === 'estate_sale' || store.kind === 'other' ? roundTo(between(r, 0, 600), 100) : 0,
        fuelCents: byFuel ? roundTo(between(r, 400, 2400), 1) : 0,
        milesTenths: byFuel ? 0 : miles,
        mileageRateCents: DEMO_MILEAGE_RATE_CENTS,
        mileageCents: byFuel ? 0 : tripMileageCents(miles, DEMO_MILEAGE_RATE_CENTS),
        notes: '', createdBy: members[0]!,
      },
    }
  })
  const items: DemoPlannedItem[] = []
  trips.forEach((trip, t) => {
    const store = DEMO_STORES[trip.storeIndex]!
    const countRange: Record<StoreKind, [number, number]> = {
      thrift_store: [9, 20], estate_sale: [12, 26], auction: [6, 14], yard_sale: [4, 10], online: [5, 12], other: [6, 14],
    }
    const [lo, hi] = countRange[store.kind]
    const acquiredOn = trip.row.tripDate as string
    const acquired = Date.parse(`${acquiredOn}T00:00:00Z`)
    for (let k = int(r, lo, hi); k > 0; k--) {
      const by = pick(r, trip.members)
      // Two thirds of the pieces carry a known mark; the mark tells the category, maker and material.
      const mark = r() < 0.68 ? pick(r, reference.marks) : null
      const categoryId = mark?.categoryIds.length ? pick(r, mark.categoryIds) : pick(r, reference.categories).id
      const category = reference.categories.find(c => c.id === categoryId)!
      const shape = SHAPES[category.name] ?? FALLBACK_SHAPE
      const quantity = shape.setOf && r() < 0.35 ? int(r, shape.setOf[0], shape.setOf[1]) : 1
      const noun = pick(r, shape.nouns)
      const title = `${pick(r, LOOKS)} ${noun}${quantity > 1 && !noun.endsWith('s') && !noun.includes('set') ? ` (set of ${quantity})` : ''}`

      // Thrift tags of a few dollars a piece; estate sales, auctions and flea markets cost more.
      const pieceMedian = { thrift_store: 299, yard_sale: 150, estate_sale: 700, auction: 1100, online: 900, other: 500 }[store.kind]
      const piece = Math.min(6000, roundTo(logNormal(r, pieceMedian, 0.55), store.kind === 'thrift_store' ? 50 : 25))
      const costCents = piece * (store.kind === 'auction' ? 1 : quantity) + (store.kind === 'thrift_store' && r() < 0.6 ? Math.round(piece * quantity * 0.07) : 0)

      const grams = Math.round(between(r, shape.grams[0], shape.grams[1]) * (quantity > 1 ? Math.min(quantity, 4) / 1.5 : 1))
      // Box sides in mm: the piece plus 3 cm of padding.
      const side = () => Math.round(between(r, shape.sideCm[0], shape.sideCm[1]) * 10) + 30
      const box = [side(), side(), side()] as const

      const conditionRoll = r()
      const condition = conditionRoll < 0.04 ? 'new' : conditionRoll < 0.3 ? 'excellent' : conditionRoll < 0.68 ? 'very_good' : conditionRoll < 0.9 ? 'good' : conditionRoll < 0.97 ? 'fair' : 'poor'
      const damageFlags: DamageFlag[] = []
      if (condition === 'good' || condition === 'fair' || condition === 'poor' || r() < 0.08) {
        damageFlags.push(pick(r, ['chip', 'hairline', 'crazing', 'worn_gilding', 'worn_paint', 'repair', 'stain', 'missing_part'] as const))
        if (r() < 0.2) {
          const second = pick(r, ['crazing', 'worn_paint', 'stain'] as const)
          if (!damageFlags.includes(second)) damageFlags.push(second)
        }
      }
      const damageNotes = damageFlags.map(f => pick(r, DAMAGE_NOTES[f] ?? [''])).filter(Boolean).join(' ')

      // Sale price: mostly $8–$120, a few higher; damage and a low grade take some off.
      const high = r() < 0.035
      let sale = high ? between(r, 12_500, 45_000) : Math.min(12_000, Math.max(800, logNormal(r, Math.max(1800, costCents * 4.5), 0.6)))
      if (damageFlags.length) sale *= 0.7
      const salePriceCents = roundTo(sale, 100) - (r() < 0.5 ? 1 : 0)
      const askingCents = roundTo(salePriceCents * between(r, 1.05, 1.35), 100) - 1

      // Days to sell, skewed: many within two weeks, a long tail, and about a fifth that do not sell.
      const roll = r()
      const days = roll < 0.42 ? Math.floor(-Math.log(1 - r()) * 5) : roll < 0.65 ? int(r, 10, 60) : roll < 0.79 ? Math.round(logNormal(r, 120, 0.6)) : null
      const listedOn = isoDay(acquired + int(r, 0, 6) * DAY_MS)
      const listedAt = Date.parse(`${listedOn}T00:00:00Z`)
      const profileIndex = DEMO_FEE_PROFILES.indexOf(weighted(r, DEMO_FEE_PROFILES, p => p.share))
      const profile = DEMO_FEE_PROFILES[profileIndex]!
      const events: DemoPlannedItem['events'] = [{ from: null, to: 'in_stock', on: acquiredOn, by }]
      const item: DemoPlannedItem = {
        title, status: 'in_stock', categoryId, markId: mark?.id ?? null, makerId: mark?.makerId ?? null,
        materialId: mark?.materialIds.length ? pick(r, mark.materialIds) : null,
        quantity, condition, damageFlags, damageNotes, weightGrams: grams,
        boxLengthMm: box[0], boxWidthMm: box[1], boxHeightMm: box[2],
        tripIndex: t, storeIndex: trip.storeIndex, profileIndex: null, acquiredOn, costCents, sourcedBy: by, listedBy: null,
        listedOn: null, askingCents: null, soldOn: null, shippedOn: null, salePriceCents: null,
        shippingChargedCents: null, postageCents: null, suppliesCents: null, feesCents: null, feesManual: false, refundCents: null,
        externalId: null, notes: '', createdBy: by, updatedBy: by, events,
      }
      const move = (to: ItemStatus, on: string) => {
        events.push({ from: item.status!, to, on, by })
        item.status = to
      }
      const age = Math.round((today - acquired) / DAY_MS)
      if (listedAt <= today && !(days === null && r() < 0.12)) {
        Object.assign(item, { listedOn, listedBy: by, askingCents, profileIndex: profile.inPerson ? null : profileIndex })
        move('listed', listedOn)
      }
      const soldAt = days === null ? null : Math.max(acquired + days * DAY_MS, item.listedOn ? listedAt : acquired)
      if (soldAt !== null && soldAt <= today) {
        const soldOn = isoDay(soldAt)
        const postage = profile.inPerson ? null : estimatePostage({ value: grams, unit: 'g' }, { length: box[0] / 10, width: box[1] / 10, height: box[2] / 10, unit: 'cm' }).priceCents
        const freeShipping = r() < 0.4
        const shippingChargedCents = profile.inPerson ? 0 : freeShipping ? 0 : postage ?? 0
        const fees = computeFees(profile, salePriceCents, shippingChargedCents).totalCents
        Object.assign(item, {
          soldOn, salePriceCents, shippingChargedCents, postageCents: profile.inPerson ? 0 : postage ?? 0,
          suppliesCents: profile.inPerson ? 0 : int(r, 40, 160), feesCents: fees, profileIndex,
        })
        move('sold', soldOn)
        const shipAt = soldAt + int(r, 0, 2) * DAY_MS
        if (!profile.inPerson && shipAt <= today) {
          item.shippedOn = isoDay(shipAt)
          move('shipped', item.shippedOn)
          const returnAt = shipAt + int(r, 5, 20) * DAY_MS
          if (r() < 0.035 && returnAt <= today) {
            item.refundCents = salePriceCents + shippingChargedCents
            move('returned', isoDay(returnAt))
            if (r() < 0.5) move(r() < 0.5 ? 'donated' : 'kept', isoDay(Math.min(today, returnAt + 30 * DAY_MS)))
          }
        }
      }
      else if (age > 200 && r() < 0.3) {
        // Old stock that never sold: given away, written off (broken in storage) or kept.
        const endRoll = r()
        move(endRoll < 0.55 ? 'donated' : endRoll < 0.8 ? 'written_off' : 'kept', isoDay(acquired + int(r, 150, Math.min(age, 400)) * DAY_MS))
      }
      const figures: ItemFigures = {
        status: item.status!, quantity, costCents, acquiredOn, listedOn: item.listedOn ?? null, soldOn: item.soldOn ?? null,
        shippedOn: item.shippedOn ?? null, askingCents: item.askingCents ?? null, salePriceCents: item.salePriceCents ?? null,
        shippingChargedCents: item.shippingChargedCents ?? null, postageCents: item.postageCents ?? null, suppliesCents: item.suppliesCents ?? null,
        feesCents: item.feesCents ?? null, refundCents: item.refundCents ?? null,
      }
      const problems = checkItemConsistency(figures)
      if (Object.keys(problems).length) throw new Error(`Demo item "${title}" breaks a rule: ${JSON.stringify(problems)}`)
      item.netProfitCents = itemNetProfitCents(figures)
      items.push(item)
    }
  })

  return { trips, items }
}

export async function seedDemoLedger(db: DbOrTx, teamId: number, options: DemoLedgerOptions): Promise<DemoLedgerSummary> {
  const plan = planDemoLedger(await loadReference(db, teamId), { sourcers: options.sourcers, today: options.today ?? new Date().toISOString().slice(0, 10) })
  await db.insert(schema.ledgerSettings).values({ teamId, mileageRateCents: DEMO_MILEAGE_RATE_CENTS, conditionScale: [...DEFAULT_CONDITION_SCALE] })
  const profileIds = await insertBatches(db, schema.feeProfiles, DEMO_FEE_PROFILES.map(p => ({
    teamId, name: p.name, channel: p.channel, percentBp: p.percentBp, fixedCents: p.fixedCents,
    paymentPercentBp: p.paymentPercentBp, paymentFixedCents: p.paymentFixedCents, defaultFlag: p.isDefault ? 1 : null,
  })), true)
  const storeIds = await insertBatches(db, schema.stores, DEMO_STORES.map((s, i) => ({
    teamId, name: s.name, kind: s.kind, town: s.town, notes: s.notes, createdBy: options.sourcers[i % options.sourcers.length]!,
  })), true)
  const tripIds = await insertBatches(db, schema.sourcingTrips, plan.trips.map(t => ({ ...t.row, teamId, storeId: storeIds[t.storeIndex]! })), true)
  await insertBatches(db, schema.tripMembers, plan.trips.flatMap((t, i) => t.members.map(userId => ({ teamId, tripId: tripIds[i]!, userId }))), false)
  const itemIds = await insertBatches(db, schema.items, plan.items.map(({ events: _events, tripIndex, storeIndex, profileIndex, ...row }) => ({
    ...row, teamId, tripId: tripIds[tripIndex]!, storeId: storeIds[storeIndex]!, feeProfileId: profileIndex === null ? null : profileIds[profileIndex]!,
  })), true)
  const events = plan.items.flatMap((item, i) => item.events.map(e => ({ teamId, itemId: itemIds[i]!, fromStatus: e.from, toStatus: e.to, happenedOn: e.on, changedBy: e.by })))
  await insertBatches(db, schema.itemStatusEvents, events, false)
  return { stores: storeIds.length, trips: tripIds.length, items: itemIds.length, events: events.length }
}
