// Seeds the demo team's reference wiki: starter materials, the invented categories, makers, marks and
// lookalikes, each with its first revision, plus a few timeline notes. Runs outside Nitro (plain imports
// only) and writes in multi-row batches so seeding stays fast.
import type { MySqlTable } from 'drizzle-orm/mysql-core'
import * as schema from '../schema'
import { DEMO_TEAM } from './demo-team'
import { buildDemoReference } from './demo-reference'
import { STARTER_MATERIALS } from './materials'
import { wikiChangedFields, wikiLinkTargets, wikiNewContent } from '../../utils/wiki/content'
import { wikiConfigs } from '../../utils/wiki/registry'
import type { WikiTypeConfig } from '../../utils/wiki/types'
import type { DbOrTx } from '../../utils/db'
import type { CategoryContent, MakerContent, MarkContent, MaterialContent, WikiEntryType } from '../../../shared/schemas/wiki'

const BATCH = 100

async function insertBatches(db: DbOrTx, table: MySqlTable, rows: Record<string, unknown>[]): Promise<number[]> {
  const ids: number[] = []
  for (let i = 0; i < rows.length; i += BATCH) {
    const chunk = rows.slice(i, i + BATCH)
    const query = db.insert(table).values(chunk as never)
    if ('id' in (table as unknown as Record<string, unknown>)) ids.push(...(await query.$returningId() as { id: number }[]).map(r => r.id))
    else await query
  }
  return ids
}

export interface SeedAuthors {
  /** Members allowed to write entries (owner, editor): revisions are spread over them. */
  editors: number[]
  /** Members who write timeline notes (contributors and above). */
  noteAuthors: number[]
}

interface Planned<C extends object> { key: string, content: C, id?: number }

/**
 * Writes entries of one type: main rows (one batch per 100), then child rows, links and first revisions.
 * `resolve` fills in references to entries written earlier, once this type's own ids are known.
 */
class ReferenceWriter {
  private revisions: Record<string, unknown>[] = []
  private links: Record<string, unknown>[] = []
  private authorIndex = 0

  constructor(private db: DbOrTx, private teamId: number, private authors: SeedAuthors) {}

  private nextAuthor(): number {
    return this.authors.editors[this.authorIndex++ % this.authors.editors.length]!
  }

  async write<C extends object>(type: WikiEntryType, planned: Planned<C>[], resolve?: (byKey: Map<string, number>) => void): Promise<Map<string, number>> {
    const config = wikiConfigs[type] as WikiTypeConfig<C>
    const authors = planned.map(() => this.nextAuthor())
    const ids = await insertBatches(this.db, config.table, planned.map((p, i) => ({
      ...config.toRow(p.content), teamId: this.teamId, revision: 1, createdBy: authors[i], updatedBy: authors[i],
    })))
    const byKey = new Map(planned.map((p, i) => [p.key, ids[i]!]))
    planned.forEach((p, i) => { p.id = ids[i] })
    resolve?.(byKey)
    const children = new Map<MySqlTable, Map<string, Record<string, unknown>>>()
    for (const p of planned) {
      for (const { table, rows } of config.childRows?.(this.teamId, p.id!, p.content) ?? []) {
        // A lookalike pair comes from both of its marks: the same row twice, stored once.
        const unique = children.get(table) ?? children.set(table, new Map()).get(table)!
        for (const row of rows) unique.set(JSON.stringify(row), row)
      }
    }
    for (const [table, rows] of children) await insertBatches(this.db, table, [...rows.values()])
    planned.forEach((p, i) => {
      this.revisions.push({
        teamId: this.teamId, entryType: type, entryId: p.id, revision: 1, action: 'create',
        changedFields: wikiChangedFields(config, null, p.content), snapshot: p.content, authorId: authors[i],
      })
      for (const target of wikiLinkTargets(config, DEMO_TEAM.slug, p.id!, p.content)) {
        this.links.push({ teamId: this.teamId, fromType: type, fromId: p.id, toType: target.type, toId: target.id })
      }
    })
    return byKey
  }

  /** Revisions and links last, when every entry (and so every link target) exists. */
  async finish(existing: Record<WikiEntryType, Set<number>>) {
    await insertBatches(this.db, schema.entryRevisions, this.revisions)
    await insertBatches(this.db, schema.entryLinks, this.links.filter(l => existing[l.toType as WikiEntryType].has(l.toId as number)))
  }
}

function content<C extends object>(type: WikiEntryType, key: string, given: Partial<C>): Planned<C> {
  const config = wikiConfigs[type] as WikiTypeConfig<C>
  // The same rules as the API: a demo entry the editor would refuse fails the seed loudly.
  const parsed = config.contentSchema.safeParse(wikiNewContent(config, given))
  if (!parsed.success) throw new Error(`Demo ${type} "${key}" breaks a rule: ${JSON.stringify(parsed.error.issues[0])}`)
  return { key, content: parsed.data }
}

const need = (map: Map<string, number>, key: string, what: string): number => {
  const id = map.get(key)
  if (id === undefined) throw new Error(`Demo data names an unknown ${what} "${key}".`)
  return id
}

// Timeline notes in the team's voice, placed on the first entries of each kind.
const DEMO_NOTES: { type: WikiEntryType, index: number, body: string, daysAgo: number | null }[] = [
  { type: 'mark', index: 0, body: 'Found two at the church rummage sale, $2 each. Both sold within the week.', daysAgo: 40 },
  { type: 'mark', index: 0, body: 'A buyer asked for a close-up of this mark before paying: **photograph the base in daylight**.', daysAgo: 12 },
  { type: 'mark', index: 1, body: 'The worn version of this mark is easy to misread. Tilt it under the light.', daysAgo: null },
  { type: 'mark', index: 2, body: 'Estate sale on Birch Street had a shelf of these; we took the three without chips.', daysAgo: 75 },
  { type: 'maker', index: 0, body: 'Local buyers pay more for this maker than online ones do: try the Saturday market first.', daysAgo: 20 },
  { type: 'maker', index: 1, body: 'Checked the catalogue at the library: the shape numbers run in the hundreds.', daysAgo: 5 },
  { type: 'material', index: 0, body: 'Reminder: tap test before the price sticker, not after.', daysAgo: null },
  { type: 'category', index: 0, body: 'Spring clearance: this shelf moved slowly, hold off buying more until autumn.', daysAgo: 30 },
]

export async function seedDemoReference(db: DbOrTx, teamId: number, authors: SeedAuthors): Promise<{ entries: number, notes: number }> {
  const reference = buildDemoReference()
  const writer = new ReferenceWriter(db, teamId, authors)

  const materials = await writer.write('material', STARTER_MATERIALS.map(m => content<MaterialContent>('material', m.key, {
    name: m.name, recognition: m.recognition, checks: m.checks, damage: m.damage, cautions: m.cautions,
    handbookPath: m.handbookPath, sources: m.sources, notes: m.notes, tags: m.tags,
  })))

  // Parents before children, one level per batch, so every parentId points at a stored row.
  const categories = new Map<string, number>()
  let remaining = reference.categories
  while (remaining.length) {
    const ready = remaining.filter(c => c.parentKey === null || categories.has(c.parentKey))
    if (!ready.length) throw new Error(`Demo categories form a loop or name unknown parents: ${remaining.map(c => c.key).join(', ')}`)
    const written = await writer.write('category', ready.map(c => content<CategoryContent>('category', c.key, {
      name: c.name, parentId: c.parentKey === null ? null : categories.get(c.parentKey)!, notes: c.notes, tags: c.tags,
    })))
    for (const [key, id] of written) categories.set(key, id)
    remaining = remaining.filter(c => !written.has(c.key))
  }

  const makers = await writer.write('maker', reference.makers.map(m => content<MakerContent>('maker', m.key, {
    name: m.name, otherNames: m.otherNames, country: m.country, yearFrom: m.yearFrom, yearFromApprox: m.yearFromApprox,
    yearTo: m.yearTo, yearToApprox: m.yearToApprox, notes: m.notes, tags: m.tags,
  })))

  const plannedMarks = reference.marks.map(m => content<MarkContent>('mark', m.key, {
    title: m.title, makerId: m.makerKey === null ? null : need(makers, m.makerKey, 'maker'), inscriptions: m.inscriptions,
    markType: m.markType, colour: m.colour, position: m.position, yearFrom: m.yearFrom, yearTo: m.yearTo,
    dateConfidence: m.dateConfidence, country: m.country,
    materialIds: [...new Set(m.materialKeys.map(k => need(materials, k, 'material')))].sort((a, b) => a - b),
    categoryIds: [...new Set(m.categoryKeys.map(k => need(categories, k, 'category')))].sort((a, b) => a - b),
    tags: m.tags, notes: m.notes,
  }))
  const marks = await writer.write('mark', plannedMarks, (byKey) => {
    // Lookalikes need the marks' own ids: filled in before child rows and revisions are written.
    const byMark = new Map(plannedMarks.map(p => [p.key, p]))
    for (const pair of reference.lookalikes) {
      const a = need(byKey, pair.markKey, 'mark')
      const b = need(byKey, pair.otherMarkKey, 'mark')
      byMark.get(pair.markKey)!.content.lookalikes.push({ markId: b, howToTell: pair.howToTell })
      byMark.get(pair.otherMarkKey)!.content.lookalikes.push({ markId: a, howToTell: pair.howToTell })
    }
    for (const p of plannedMarks) {
      // A pair listed from both ends is one pair.
      p.content.lookalikes = [...new Map(p.content.lookalikes.map(l => [l.markId, l])).values()].sort((x, y) => x.markId - y.markId)
    }
  })

  const ids: Record<WikiEntryType, number[]> = {
    mark: [...marks.values()], maker: [...makers.values()], material: [...materials.values()], category: [...categories.values()],
  }
  await writer.finish({ mark: new Set(ids.mark), maker: new Set(ids.maker), material: new Set(ids.material), category: new Set(ids.category) })

  const now = Date.now()
  const notes = DEMO_NOTES.filter(n => ids[n.type][n.index] !== undefined).map((n, i) => ({
    teamId, entryType: n.type, entryId: ids[n.type][n.index]!, authorId: authors.noteAuthors[i % authors.noteAuthors.length]!, body: n.body,
    happenedOn: n.daysAgo === null ? null : new Date(now - n.daysAgo * 86_400_000).toISOString().slice(0, 10),
  }))
  await insertBatches(db, schema.entryNotes, notes)
  return { entries: Object.values(ids).reduce((sum, list) => sum + list.length, 0), notes: notes.length }
}
