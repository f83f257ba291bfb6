// The team export file (team.json inside the team's zip): its shape, limits and every reference inside it.
// An import checks the whole document with this schema before it writes anything; ids in the file only tie
// its own records together, the import gives every record a new id.
import { z } from 'zod'
import { ROLES } from '../roles'
import { teamPatchSchema } from './auth'
import { DAMAGE_FLAGS, ITEM_STATUSES, STORE_KINDS } from '../ledger/item-rules'
import { LEDGER_CURRENCIES } from '../ledger/currencies'
import { PHOTO_ENTITY_TYPES } from '../photos'
import { LEDGER_LIMITS } from './ledger'
import { BUY_TARGET_LIMITS } from './reports'
import {
  WIKI_ENTRY_TYPES, categoryContentSchema, makerContentSchema, markContentSchema, materialContentSchema, type WikiEntryType,
} from './wiki'

export const TRANSFER_FORMAT = 'tallymark-team-export'
export const TRANSFER_VERSION = 1
export const TRANSFER_PHOTO_TYPES = ['image/webp', 'image/jpeg', 'image/png'] as const
/** Names of photo files inside the zip: photos/<photo id in the file>/<size>.<ext>. */
export const TRANSFER_PHOTO_PATH = /^photos\/\d{1,15}\/(?:display|thumb)\.(?:webp|jpg|png)$/

const L = LEDGER_LIMITS
const TEXT_MAX = 65_535
const MEDIUM_TEXT_MAX = 1_000_000

const id = z.number({ message: 'Expected an id (a whole number).' }).int().positive().max(Number.MAX_SAFE_INTEGER)
const ref = id.nullable()
const when = z.iso.datetime({ message: 'Expected a UTC time like 2026-03-01T12:00:00.000Z.' })
const day = z.iso.date({ message: 'Expected a date like 2026-03-01.' })
const text = (max: number) => z.string().max(max, `At most ${max.toLocaleString('en')} characters.`)
const count = (min: number, max: number) => z.number().int().min(min).max(max)
const cents = count(0, L.maxCents)
const netCents = count(-L.maxCents * 4, L.maxCents * 4)
const revision = count(1, 1_000_000_000)
const list = <T extends z.ZodType>(item: T, max = 5_000_000) => z.array(item).max(max)
const entryType = z.enum(WIKI_ENTRY_TYPES)
const stamps = { createdAt: when, updatedAt: when }

const entryBookkeeping = {
  id, revision, createdBy: id, updatedBy: id, deletedAt: when.nullable(), deletedBy: ref, ...stamps,
}

const person = z.object({
  id,
  email: text(254).min(3),
  name: text(120),
  // null: no longer on the team, but named in its history.
  role: z.enum(ROLES).nullable(),
})

const team = z.object({ name: text(120), slug: text(64), timeZone: teamPatchSchema.shape.timeZone.unwrap() })

const ledgerSettings = z.object({
  mileageRateCents: count(0, 10_000),
  conditionScale: z.array(text(L.conditionGrade).min(1)).min(1).max(L.conditionScale),
  // Absent in files from before teams chose a currency: the default applies.
  currency: z.enum(LEDGER_CURRENCIES).optional(),
  ...stamps,
})

const buyTargets = z.object({
  revision,
  minProfitCents: count(0, BUY_TARGET_LIMITS.maxProfitCents),
  minRoiBp: count(0, BUY_TARGET_LIMITS.maxRoiPercent * 100),
  maxDaysToSell: count(1, BUY_TARGET_LIMITS.maxDays),
  updatedBy: id,
  ...stamps,
})

const importMapping = z.object({
  headerKey: z.string().regex(/^[0-9a-f]{64}$/, 'Expected a SHA-256 in hex.'),
  headers: z.array(text(1_000)).max(1_000),
  mapping: z.record(text(1_000), text(64)),
  dateOrder: z.enum(['mdy', 'dmy']),
  updatedBy: id,
  lastUsedAt: when,
  ...stamps,
})

const store = z.object({
  id, revision, name: text(L.name).min(1), kind: z.enum(STORE_KINDS), town: text(L.town), notes: text(TEXT_MAX), createdBy: id, ...stamps,
})

const feeProfile = z.object({
  id, revision, name: text(L.name).min(1), channel: text(L.name),
  percentBp: count(0, 10_000), fixedCents: cents, paymentPercentBp: count(0, 10_000), paymentFixedCents: cents,
  isDefault: z.boolean(), ...stamps,
})

const maker = makerContentSchema.extend(entryBookkeeping)
const material = materialContentSchema.extend(entryBookkeeping)
const category = categoryContentSchema.extend(entryBookkeeping)
// Lookalike pairs travel once each, in `lookalikes`, not inside both marks.
const mark = markContentSchema.omit({ lookalikes: true }).extend(entryBookkeeping)

const lookalike = z.object({ markLowId: id, markHighId: id, howToTell: text(TEXT_MAX) })
const link = z.object({ fromType: entryType, fromId: id, toType: entryType, toId: id })

const entryRevision = z.object({
  id, entryType, entryId: id, revision, action: z.enum(['create', 'edit', 'restore']), restoredFrom: revision.nullable(),
  changedFields: z.array(text(64)).max(100),
  snapshot: z.record(z.string().max(64), z.unknown()),
  authorId: id, createdAt: when,
})

const note = z.object({ id, entryType, entryId: id, authorId: id, body: text(MEDIUM_TEXT_MAX).min(1), happenedOn: day.nullable(), ...stamps })

const trip = z.object({
  id, revision, storeId: id, tripDate: day,
  bagsCents: cents, parkingCents: cents, fuelCents: cents,
  milesTenths: count(0, L.maxMiles * 10), mileageRateCents: count(0, 10_000), mileageCents: cents,
  notes: text(TEXT_MAX), createdBy: id, memberIds: z.array(id).max(1_000), ...stamps,
})

const statusEvent = z.object({
  fromStatus: z.enum(ITEM_STATUSES).nullable(), toStatus: z.enum(ITEM_STATUSES), happenedOn: day, changedBy: id, changedAt: when,
})

const optionalCents = cents.nullable()
const side = count(1, 10_000_000).nullable()
const item = z.object({
  id, revision, title: text(L.title).min(1), status: z.enum(ITEM_STATUSES),
  categoryId: ref, markId: ref, makerId: ref, materialId: ref,
  quantity: count(1, 1_000_000), condition: text(L.conditionGrade).nullable(),
  damageFlags: z.array(z.enum(DAMAGE_FLAGS)).max(DAMAGE_FLAGS.length), damageNotes: text(TEXT_MAX),
  weightGrams: count(0, 100_000_000).nullable(), boxLengthMm: side, boxWidthMm: side, boxHeightMm: side,
  tripId: ref, storeId: ref, acquiredOn: day, costCents: cents, sourcedBy: ref, listedBy: ref, listedOn: day.nullable(),
  askingCents: optionalCents, feeProfileId: ref, soldOn: day.nullable(), shippedOn: day.nullable(),
  salePriceCents: optionalCents, shippingChargedCents: optionalCents, postageCents: optionalCents, suppliesCents: optionalCents,
  feesCents: optionalCents, feesManual: z.boolean(), refundCents: optionalCents,
  // Written for people reading the file; an import works it out again from the figures.
  netProfitCents: netCents.nullable(),
  externalId: text(L.externalId).nullable(),
  importKey: z.string().regex(/^[0-9a-f]{64}$/, 'Expected a SHA-256 in hex.').nullable(),
  notes: text(TEXT_MAX), createdBy: id, updatedBy: id, ...stamps,
  statusHistory: z.array(statusEvent).max(10_000),
})

const photoFile = z.string().regex(TRANSFER_PHOTO_PATH, 'Expected a file name like photos/12/display.webp.')
const pixels = count(1, 100_000)
const photo = z.object({
  id, entityType: z.enum(PHOTO_ENTITY_TYPES).nullable(), entityId: ref, position: count(0, 1_000_000),
  contentType: z.enum(TRANSFER_PHOTO_TYPES), width: pixels, height: pixels, thumbWidth: pixels, thumbHeight: pixels,
  bytes: count(0, 2_000_000_000), originalBytes: count(0, 2_000_000_000), uploadedBy: id, createdAt: when,
  files: z.object({ display: photoFile, thumb: photoFile }),
})

const documentShape = z.object({
  format: z.literal(TRANSFER_FORMAT, { message: `This is not a Tallymark team export (format must be "${TRANSFER_FORMAT}").` }),
  version: z.literal(TRANSFER_VERSION, { message: `This export has a version this Tallymark cannot read (expected ${TRANSFER_VERSION}).` }),
  exportedAt: when,
  team,
  people: list(person, 100_000),
  ledgerSettings: ledgerSettings.nullable(),
  buyTargets: buyTargets.nullable(),
  importMappings: list(importMapping, 10_000),
  stores: list(store),
  feeProfiles: list(feeProfile, 10_000),
  makers: list(maker),
  materials: list(material),
  categories: list(category),
  marks: list(mark),
  lookalikes: list(lookalike),
  links: list(link),
  revisions: list(entryRevision),
  notes: list(note),
  trips: list(trip),
  items: list(item),
  photos: list(photo),
})

export type TeamExport = z.infer<typeof documentShape>
export type TeamExportItem = TeamExport['items'][number]
export type TeamExportPhoto = TeamExport['photos'][number]

type Issue = { path: (string | number)[], message: string }

/** Every reference inside the file must name a record of the file: the checks a database would make, in one pass. */
export function transferReferenceIssues(doc: TeamExport, maxIssues = 50): Issue[] {
  const issues: Issue[] = []
  const add = (path: (string | number)[], message: string) => {
    if (issues.length < maxIssues) issues.push({ path, message })
  }
  const idsOf = (name: keyof TeamExport, rows: { id: number }[]) => {
    const ids = new Set<number>()
    rows.forEach((row, i) => {
      if (ids.has(row.id)) add([name, i, 'id'], `Two ${name} have the id ${row.id}.`)
      ids.add(row.id)
    })
    return ids
  }
  const people = idsOf('people', doc.people)
  const entries: Record<WikiEntryType, Set<number>> = {
    mark: idsOf('marks', doc.marks), maker: idsOf('makers', doc.makers), material: idsOf('materials', doc.materials), category: idsOf('categories', doc.categories),
  }
  const stores = idsOf('stores', doc.stores)
  const profiles = idsOf('feeProfiles', doc.feeProfiles)
  const trips = idsOf('trips', doc.trips)
  const items = idsOf('items', doc.items)
  idsOf('revisions', doc.revisions)
  idsOf('notes', doc.notes)
  idsOf('photos', doc.photos)

  const need = (set: Set<number>, value: number | null, path: (string | number)[], what: string) => {
    if (value !== null && !set.has(value)) add(path, `No ${what} with id ${value} in the file.`)
  }
  const person = (value: number | null, path: (string | number)[]) => need(people, value, path, 'person (in people)')
  const entryRows = { makers: doc.makers, materials: doc.materials, categories: doc.categories, marks: doc.marks } as const
  for (const [name, rows] of Object.entries(entryRows)) {
    rows.forEach((row, i) => {
      person(row.createdBy, [name, i, 'createdBy'])
      person(row.updatedBy, [name, i, 'updatedBy'])
      person(row.deletedBy, [name, i, 'deletedBy'])
    })
  }
  doc.marks.forEach((m, i) => {
    need(entries.maker, m.makerId, ['marks', i, 'makerId'], 'maker')
    m.materialIds.forEach((v, j) => need(entries.material, v, ['marks', i, 'materialIds', j], 'material'))
    m.categoryIds.forEach((v, j) => need(entries.category, v, ['marks', i, 'categoryIds', j], 'category'))
  })
  const parents = new Map(doc.categories.map(c => [c.id, c.parentId]))
  doc.categories.forEach((c, i) => {
    need(entries.category, c.parentId, ['categories', i, 'parentId'], 'category')
    // Walking up must end at a root: a loop would hide the whole branch from the category tree.
    const seen = new Set<number>([c.id])
    for (let at = c.parentId; at !== null && at !== undefined; at = parents.get(at) ?? null) {
      if (seen.has(at)) {
        add(['categories', i, 'parentId'], `Category ${c.id} is inside itself (its parents form a loop).`)
        break
      }
      seen.add(at)
    }
  })
  const pairs = new Set<string>()
  doc.lookalikes.forEach((l, i) => {
    need(entries.mark, l.markLowId, ['lookalikes', i, 'markLowId'], 'mark')
    need(entries.mark, l.markHighId, ['lookalikes', i, 'markHighId'], 'mark')
    if (l.markLowId >= l.markHighId) add(['lookalikes', i, 'markHighId'], 'markLowId must be the lower of the two mark ids.')
    const key = `${l.markLowId}:${l.markHighId}`
    if (pairs.has(key)) add(['lookalikes', i], `The pair ${key} is listed twice.`)
    pairs.add(key)
  })
  const links = new Set<string>()
  doc.links.forEach((l, i) => {
    need(entries[l.fromType], l.fromId, ['links', i, 'fromId'], l.fromType)
    need(entries[l.toType], l.toId, ['links', i, 'toId'], l.toType)
    const key = `${l.fromType}:${l.fromId}>${l.toType}:${l.toId}`
    if (links.has(key)) add(['links', i], 'This link is listed twice.')
    links.add(key)
  })
  const revisions = new Set<string>()
  doc.revisions.forEach((r, i) => {
    need(entries[r.entryType], r.entryId, ['revisions', i, 'entryId'], r.entryType)
    person(r.authorId, ['revisions', i, 'authorId'])
    const key = `${r.entryType}:${r.entryId}:${r.revision}`
    if (revisions.has(key)) add(['revisions', i, 'revision'], `Revision ${r.revision} of ${r.entryType} ${r.entryId} is listed twice.`)
    revisions.add(key)
  })
  doc.notes.forEach((n, i) => {
    need(entries[n.entryType], n.entryId, ['notes', i, 'entryId'], n.entryType)
    person(n.authorId, ['notes', i, 'authorId'])
  })
  const unique = (name: string, values: (string | null)[], field: string, what: string) => {
    const seen = new Set<string>()
    values.forEach((v, i) => {
      if (v === null) return
      const key = v.trim().toLowerCase()
      if (seen.has(key)) add([name, i, field], `Two ${what} are called "${v}".`)
      seen.add(key)
    })
  }
  doc.stores.forEach((s, i) => person(s.createdBy, ['stores', i, 'createdBy']))
  unique('stores', doc.stores.map(s => s.name), 'name', 'stores')
  unique('feeProfiles', doc.feeProfiles.map(p => p.name), 'name', 'fee profiles')
  if (doc.feeProfiles.filter(p => p.isDefault).length > 1) add(['feeProfiles'], 'At most one fee profile can be the default.')
  unique('importMappings', doc.importMappings.map(m => m.headerKey), 'headerKey', 'import mappings')
  doc.importMappings.forEach((m, i) => person(m.updatedBy, ['importMappings', i, 'updatedBy']))
  if (doc.buyTargets) person(doc.buyTargets.updatedBy, ['buyTargets', 'updatedBy'])
  doc.trips.forEach((t, i) => {
    need(stores, t.storeId, ['trips', i, 'storeId'], 'store')
    person(t.createdBy, ['trips', i, 'createdBy'])
    t.memberIds.forEach((m, j) => person(m, ['trips', i, 'memberIds', j]))
  })
  doc.items.forEach((it, i) => {
    need(entries.category, it.categoryId, ['items', i, 'categoryId'], 'category')
    need(entries.mark, it.markId, ['items', i, 'markId'], 'mark')
    need(entries.maker, it.makerId, ['items', i, 'makerId'], 'maker')
    need(entries.material, it.materialId, ['items', i, 'materialId'], 'material')
    need(trips, it.tripId, ['items', i, 'tripId'], 'trip')
    need(stores, it.storeId, ['items', i, 'storeId'], 'store')
    need(profiles, it.feeProfileId, ['items', i, 'feeProfileId'], 'fee profile')
    for (const field of ['sourcedBy', 'listedBy', 'createdBy', 'updatedBy'] as const) person(it[field], ['items', i, field])
    it.statusHistory.forEach((e, j) => person(e.changedBy, ['items', i, 'statusHistory', j, 'changedBy']))
  })
  unique('items', doc.items.map(it => it.importKey), 'importKey', 'items\' import keys')
  const photoTargets: Record<string, Set<number>> = { mark: entries.mark, maker: entries.maker, item: items }
  const files = new Set<string>()
  doc.photos.forEach((p, i) => {
    if ((p.entityType === null) !== (p.entityId === null)) add(['photos', i, 'entityId'], 'entityType and entityId are both set or both null.')
    if (p.entityType && p.entityId !== null) need(photoTargets[p.entityType]!, p.entityId, ['photos', i, 'entityId'], p.entityType)
    person(p.uploadedBy, ['photos', i, 'uploadedBy'])
    for (const file of [p.files.display, p.files.thumb]) {
      if (files.has(file)) add(['photos', i, 'files'], `The file ${file} belongs to two photos.`)
      files.add(file)
    }
  })
  return issues
}

/** The whole document: its shape, then every reference inside it. */
export const teamExportSchema = documentShape.superRefine((doc, ctx) => {
  for (const issue of transferReferenceIssues(doc)) ctx.addIssue({ code: 'custom', path: issue.path, message: issue.message })
})
