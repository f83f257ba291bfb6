// The search service of one app instance: a team's index is built from MariaDB the first time the team
// searches (in slices that yield to the event loop, answering from MariaDB meanwhile), kept current from
// the change log every instance polls, and dropped when it is the least recently used one over the budget.
import { and, asc, desc, eq, gt, inArray, lt, sql } from 'drizzle-orm'
import { setImmediate as yieldNow } from 'node:timers/promises'
import { photos } from '../../database/schema'
import { searchChanges } from '../../database/schema/search'
import { SEARCH_MIN_QUERY } from '../../../shared/search/options'
import type { SearchParams } from '../../../shared/search/schema'
import type { SearchHit, SearchResponse, SearchType } from '../../../shared/search/types'
import { WIKI_ENTRY_TYPES, type WikiEntryType } from '../../../shared/schemas/wiki'
import type { DbOrTx } from '../db'
import { searchOnChange } from './changes'
import type { SearchConfig } from './config'
import { searchNoteIdsOf, searchSources } from './documents'
import { searchDatabase } from './fallback'
import { SearchPopularityCounts, searchLoadPopularity, searchRefreshPopularity } from './popularity'
import type { SearchTeamIndex } from './team-index'
import { searchReadTeam } from './build'

interface TeamEntry {
  teamId: number
  state: 'building' | 'ready'
  index: SearchTeamIndex | null
  /** Sold items per mark and maker, for ties and the popular entries. */
  popularity: SearchPopularityCounts
  /** Resolves when the build is done (or failed). */
  built: Promise<void>
  /** Change ids at or below this are in the index; above it, `applied` says which are. */
  floor: number
  applied: Set<number>
  dropped: boolean
}

interface ChangeRow { id: number, teamId: number, entityType: string, entityId: number }

export interface SearchStats { teams: { teamId: number, state: TeamEntry['state'], documents: number }[], documents: number }

const sleep = (ms: number) => new Promise<void>(resolve => setTimeout(resolve, ms))
const POLL_BATCH = 5000
const PRUNE_EVERY_MS = 10 * 60 * 1000

/**
 * A photo's thumbnail address, as photoUrls (server/utils/photos.ts) gives it; written out here so that the search
 * worker's bundle leaves out the image and storage code that module brings (tests/unit/search-thumb.test.ts
 * keeps the two the same).
 */
export function searchThumbUrl(teamSlug: string, photoId: number): string {
  return `/api/teams/${encodeURIComponent(teamSlug)}/photos/${photoId}/thumb`
}

export class SearchService {
  // Map order is recency order: a search moves its team to the end; eviction takes from the front.
  private readonly teams = new Map<number, TeamEntry>()
  private timer: NodeJS.Timeout | null = null
  private polling: Promise<void> | null = null
  private pokeTimer: NodeJS.Timeout | null = null
  private lastPrune = 0
  private unsubscribe: (() => void) | null = null

  constructor(private readonly db: DbOrTx, readonly config: SearchConfig, private readonly log: (message: string, error?: unknown) => void = console.error) {}

  start(): this {
    if (this.timer) return this
    this.timer = setInterval(() => void this.poll(), this.config.pollMs)
    this.timer.unref()
    this.unsubscribe = searchOnChange(() => this.pollSoon())
    return this
  }

  stop(): void {
    if (this.timer) clearInterval(this.timer)
    if (this.pokeTimer) clearTimeout(this.pokeTimer)
    this.timer = null
    this.unsubscribe?.()
  }

  /** A write was logged somewhere in this process: read the change log soon (searchOnChange does this in-process). */
  changed(): void {
    this.pollSoon()
  }

  stats(): SearchStats {
    const teams = [...this.teams.values()].map(t => ({ teamId: t.teamId, state: t.state, documents: t.index?.size ?? 0 }))
    return { teams, documents: teams.reduce((n, t) => n + t.documents, 0) }
  }

  /** The team's entry, built on first use; moved to the recent end. */
  private touch(teamId: number): TeamEntry {
    let entry = this.teams.get(teamId)
    if (entry) {
      this.teams.delete(teamId)
      this.teams.set(teamId, entry)
      return entry
    }
    entry = { teamId, state: 'building', index: null, popularity: new SearchPopularityCounts(), built: Promise.resolve(), floor: 0, applied: new Set(), dropped: false }
    this.teams.set(teamId, entry)
    entry.built = this.build(entry)
    return entry
  }

  /** Starts the team's build if needed and waits until it is ready (benchmarks and warm-up). */
  async ready(teamId: number): Promise<void> {
    const entry = this.touch(teamId)
    await entry.built
    if (entry.state !== 'ready') throw new Error(`The search index of team ${teamId} could not be built.`)
  }

  private async build(entry: TeamEntry): Promise<void> {
    const started = performance.now()
    try {
      if (this.config.buildDelayMs) await sleep(this.config.buildDelayMs)
      // Everything at or below the settled id was committed before the reads below: the data has it.
      entry.floor = await this.settledChangeId()
      entry.popularity = await searchLoadPopularity(this.db, entry.teamId)
      const index = await searchReadTeam(this.db, entry.teamId, { pageSize: this.config.buildPageSize, pause: this.slicer(), stopped: () => entry.dropped })
      if (!index || entry.dropped) return
      entry.index = index
      entry.state = 'ready'
      this.evict(entry.teamId)
      if (process.env.SEARCH_LOG_BUILDS) this.log(`[search] team ${entry.teamId}: ${index.size} documents indexed in ${Math.round(performance.now() - started)} ms`)
      // Changes written during the build are applied now, not at the next tick.
      this.pollSoon()
    }
    catch (error) {
      this.log(`[search] building the index of team ${entry.teamId} failed`, error)
      if (this.teams.get(entry.teamId) === entry) this.teams.delete(entry.teamId)
    }
  }

  /** Yields to the event loop after every buildSliceMs of building, so searches of other teams keep flowing. */
  private slicer(): () => Promise<void> | undefined {
    let slice = performance.now()
    return () => {
      if (performance.now() - slice <= this.config.buildSliceMs) return undefined
      return yieldNow().then(() => { slice = performance.now() })
    }
  }

  /** Drops least recently used teams while over the team count or the document budget. */
  private evict(keep: number): void {
    const over = () => {
      const { documents } = this.stats()
      return this.teams.size > this.config.maxTeams || documents > this.config.maxDocuments
    }
    for (const entry of [...this.teams.values()]) {
      if (!over()) break
      if (entry.teamId === keep || entry.state !== 'ready') continue
      entry.dropped = true
      this.teams.delete(entry.teamId)
    }
  }

  /** The highest change id whose write has surely settled (committed or rolled back) by now. */
  private async settledChangeId(): Promise<number> {
    const c = searchChanges
    const [row] = await this.db.select({ id: c.id }).from(c)
      .where(lt(c.changedAt, sql`now(3) - interval ${Math.ceil(this.config.settleMs / 1000)} second`))
      .orderBy(desc(c.changedAt), desc(c.id)).limit(1)
    return row?.id ?? 0
  }

  private pollSoon(): void {
    if (this.pokeTimer) return
    this.pokeTimer = setTimeout(() => {
      this.pokeTimer = null
      void this.poll()
    }, 25)
    this.pokeTimer.unref()
  }

  /** Reads new change-log rows for the teams held here and applies them. Safe to call at any time. */
  async poll(): Promise<void> {
    if (this.polling) return await this.polling
    this.polling = this.pollOnce().catch(error => this.log('[search] reading the change log failed', error)).finally(() => { this.polling = null })
    return await this.polling
  }

  private async pollOnce(): Promise<void> {
    await this.prune()
    const ready = [...this.teams.values()].filter(t => t.state === 'ready')
    if (!ready.length) return
    const settled = await this.settledChangeId()
    const from = Math.min(...ready.map(t => t.floor))
    const c = searchChanges
    const rows = await this.db.select({ id: c.id, teamId: c.teamId, entityType: c.entityType, entityId: c.entityId }).from(c)
      .where(and(gt(c.id, from), inArray(c.teamId, ready.map(t => t.teamId)))).orderBy(asc(c.id)).limit(POLL_BATCH) as ChangeRow[]
    // A full batch may have more behind it: the floor must not pass what was not read.
    const reachedTo = rows.length === POLL_BATCH ? rows[rows.length - 1]!.id : Number.MAX_SAFE_INTEGER
    for (const entry of ready) {
      const mine = rows.filter(r => r.teamId === entry.teamId && r.id > entry.floor && !entry.applied.has(r.id))
      if (mine.length) await this.apply(entry, mine)
      if (entry.dropped) continue
      for (const r of mine) entry.applied.add(r.id)
      entry.floor = Math.max(entry.floor, Math.min(settled, reachedTo))
      for (const id of entry.applied) if (id <= entry.floor) entry.applied.delete(id)
    }
  }

  private async prune(): Promise<void> {
    if (Date.now() - this.lastPrune < PRUNE_EVERY_MS) return
    this.lastPrune = Date.now()
    await this.db.delete(searchChanges).where(lt(searchChanges.changedAt, new Date(Date.now() - this.config.keepChangesMs)))
  }

  /** Re-reads the changed entries and replaces, adds or discards their documents. */
  private async apply(entry: TeamEntry, rows: ChangeRow[]): Promise<void> {
    const index = entry.index!
    const wanted = new Map<SearchType, Set<number>>()
    const want = (type: SearchType, id: number) => (wanted.get(type) ?? wanted.set(type, new Set()).get(type)!).add(id)
    for (const r of rows) if (r.entityType in searchSources) want(r.entityType as SearchType, r.entityId)
    await this.applyItems(entry, rows, wanted.get('mark'))
    if (entry.dropped) return
    for (const [type, ids] of [...wanted]) {
      const list = [...ids]
      const dependents = await searchSources[type].dependents?.(this.db, entry.teamId, list)
      for (const id of dependents?.ids ?? []) want(dependents!.type, id)
      // An entry's notes follow it (a purge deletes them).
      if ((WIKI_ENTRY_TYPES as readonly string[]).includes(type)) {
        for (const id of await searchNoteIdsOf(this.db, entry.teamId, type as WikiEntryType, list)) want('note', id)
        for (const id of list) for (const key of index.keysOfNotesOn(type, id)) want('note', Number(key.slice(5)))
      }
    }
    for (const [type, ids] of wanted) {
      const list = [...ids]
      const records = await searchSources[type].byIds(this.db, entry.teamId, list)
      if (entry.dropped) return
      const present = new Set(records.map(r => r.id))
      for (const record of records) index.upsert(record)
      for (const id of list) if (!present.has(id)) index.remove(`${type}:${id}`)
    }
  }

  /** Sales counts: changed items are read again (id 0: the whole team); a mark's maker reaches its sold items. */
  private async applyItems(entry: TeamEntry, rows: ChangeRow[], marks: Set<number> | undefined): Promise<void> {
    const itemIds = new Set(rows.filter(r => r.entityType === 'item').map(r => r.entityId))
    if (itemIds.has(0)) {
      const counts = await searchLoadPopularity(this.db, entry.teamId)
      if (!entry.dropped) entry.popularity = counts
      return
    }
    if (marks?.size) for (const id of entry.popularity.itemsOn(marks)) itemIds.add(id)
    if (itemIds.size) await searchRefreshPopularity(this.db, entry.teamId, entry.popularity, [...itemIds])
  }

  /** The search API: the team's index when it is ready, MariaDB while it is being built. */
  async search(team: { id: number, slug: string }, params: SearchParams): Promise<SearchResponse> {
    const started = performance.now()
    const entry = this.touch(team.id)
    if (entry.state !== 'ready' && this.config.buildWaitMs) {
      await Promise.race([entry.built, sleep(this.config.buildWaitMs)])
    }
    const recent = params.q.length < SEARCH_MIN_QUERY
    let found
    let source: SearchResponse['source']
    if (entry.state === 'ready' && entry.index) {
      const popularity = entry.popularity.of
      found = recent ? entry.index.recent(team.slug, params, popularity) : entry.index.search(team.slug, params, popularity)
      source = 'index'
    }
    else {
      found = await searchDatabase(this.db, team, params)
      source = 'database'
    }
    await this.addThumbs(team, found.hits)
    return { hits: found.hits, total: found.total, tookMs: Math.round((performance.now() - started) * 100) / 100, source, mode: recent ? 'recent' : 'results' }
  }

  /** The same answer as JSON text, as the route sends it (the worker hands text over, not an object to copy). */
  async searchJson(team: { id: number, slug: string }, params: SearchParams): Promise<string> {
    return JSON.stringify(await this.search(team, params))
  }

  /** The first photo of each mark and maker hit, as a thumbnail URL. */
  private async addThumbs(team: { id: number, slug: string }, hits: SearchHit[]): Promise<void> {
    for (const type of ['mark', 'maker'] as const) {
      const ids = hits.filter(h => h.type === type).map(h => h.id)
      if (!ids.length) continue
      const rows = await this.db.select({ id: photos.id, entityId: photos.entityId }).from(photos)
        .where(and(eq(photos.teamId, team.id), eq(photos.entityType, type), inArray(photos.entityId, ids)))
        .orderBy(asc(photos.entityId), asc(photos.position), asc(photos.id))
      const first = new Map<number, number>()
      for (const r of rows) if (r.entityId !== null && !first.has(r.entityId)) first.set(r.entityId, r.id)
      for (const hit of hits) {
        const photoId = hit.type === type ? first.get(hit.id) : undefined
        if (photoId !== undefined) hit.thumbUrl = searchThumbUrl(team.slug, photoId)
      }
    }
  }
}
