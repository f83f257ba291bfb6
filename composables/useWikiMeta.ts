// Words and pure helpers the wiki pages share: type names, field labels, readable values for the merge
// screen and the history diff. No Nuxt or Vue imports, so the logic stays plain functions.
import {
  EMPTY_CATEGORY, EMPTY_MAKER, EMPTY_MARK, EMPTY_MATERIAL, MATERIAL_CHECK_KEYS, WIKI_PATH_SEGMENTS,
  type DateConfidence, type MarkType, type WikiContentByType, type WikiEntryType,
} from '~~/shared/schemas/wiki'
import type { WikiEntryByType } from '~~/shared/types/wiki'

export interface WikiTypeMeta {
  /** "mark", for sentences: "Save mark". */
  noun: string
  /** "Marks", for headings and navigation. */
  plural: string
  segment: string
  /** Marks and makers have photos. */
  photos: boolean
}

export const WIKI_TYPE_META: Record<WikiEntryType, WikiTypeMeta> = {
  mark: { noun: 'mark', plural: 'Marks', segment: WIKI_PATH_SEGMENTS.mark, photos: true },
  maker: { noun: 'maker', plural: 'Makers', segment: WIKI_PATH_SEGMENTS.maker, photos: true },
  material: { noun: 'material', plural: 'Materials', segment: WIKI_PATH_SEGMENTS.material, photos: false },
  category: { noun: 'category', plural: 'Categories', segment: WIKI_PATH_SEGMENTS.category, photos: false },
}

export const WIKI_EMPTY: { [T in WikiEntryType]: WikiContentByType[T] } = {
  mark: EMPTY_MARK,
  maker: EMPTY_MAKER,
  material: EMPTY_MATERIAL,
  category: EMPTY_CATEGORY,
}

export const MARK_TYPE_LABELS: Record<MarkType, string> = {
  printed: 'Printed',
  impressed: 'Impressed (pressed in)',
  incised: 'Incised (scratched in)',
  underglaze: 'Underglaze',
  painted: 'Hand-painted',
  moulded: 'Moulded (raised)',
  paper_label: 'Paper label',
  foil_label: 'Foil label',
  other: 'Other',
}

export const DATE_CONFIDENCE_LABELS: Record<DateConfidence, string> = {
  low: 'Low confidence (a guess from style)',
  medium: 'Medium confidence (one source)',
  high: 'High confidence (documented)',
}

/** For reading: "1950–1965 · medium confidence". */
export const DATE_CONFIDENCE_SHORT: Record<DateConfidence, string> = { low: 'low confidence', medium: 'medium confidence', high: 'high confidence' }

export const CHECK_LABELS: Record<typeof MATERIAL_CHECK_KEYS[number], string> = {
  weight: 'Weight',
  sound: 'Sound',
  touch: 'Touch',
  seams: 'Seams',
  uvGlow: 'UV glow',
  translucency: 'Translucency',
}

export const WIKI_FIELD_LABELS: { [T in WikiEntryType]: Record<keyof WikiContentByType[T] & string, string> } = {
  mark: {
    title: 'Title',
    makerId: 'Maker',
    inscriptions: 'Inscriptions',
    markType: 'Kind of mark',
    colour: 'Colour',
    position: 'Position on the piece',
    country: 'Country',
    yearFrom: 'In use from (year)',
    yearTo: 'In use until (year)',
    dateConfidence: 'Date confidence',
    materialIds: 'Materials',
    categoryIds: 'Categories',
    lookalikes: 'Look-alikes',
    notes: 'Notes',
    tags: 'Tags',
  },
  maker: {
    name: 'Name',
    otherNames: 'Other names',
    country: 'Country',
    yearFrom: 'Active from (year)',
    yearFromApprox: 'Start year is approximate',
    yearTo: 'Active until (year)',
    yearToApprox: 'End year is approximate',
    notes: 'Notes',
    tags: 'Tags',
  },
  material: {
    name: 'Name',
    recognition: 'How to recognise it',
    checks: 'Checks at the shelf',
    damage: 'Damage and wear',
    cautions: 'Cautions',
    handbookPath: 'Handbook page',
    sources: 'Sources',
    notes: 'Notes',
    tags: 'Tags',
  },
  category: {
    parentId: 'Parent category',
    name: 'Name',
    notes: 'Notes',
    tags: 'Tags',
  },
}

const KEY_WORDS: Record<string, string> = {
  yearFrom: 'the start year',
  yearTo: 'the end year',
  yearFromApprox: 'the start year',
  yearToApprox: 'the end year',
  markType: 'the kind of mark',
  dateConfidence: 'the date confidence',
  handbookPath: 'the handbook page',
  makerId: 'the maker',
  parentId: 'the parent category',
  materialIds: 'the materials',
  categoryIds: 'the categories',
}

/** Schema and server messages name fields by their keys ("yearTo (1900) is before yearFrom"): say it in words. */
export function wikiHumanMessage(message: string): string {
  const worded = message.replace(/\b(yearFromApprox|yearToApprox|yearFrom|yearTo|markType|dateConfidence|handbookPath|makerId|parentId|materialIds|categoryIds)\b/g, key => KEY_WORDS[key] ?? key)
  return worded.charAt(0).toUpperCase() + worded.slice(1)
}

/** Label of a field, also for nested error keys such as "inscriptions.1" or "checks.uvGlow". */
export function wikiFieldLabel(type: WikiEntryType, key: string): string {
  const [head, index, sub] = key.split('.')
  const labels = WIKI_FIELD_LABELS[type] as Record<string, string>
  const base = labels[head ?? ''] ?? head ?? key
  if (head === 'checks' && index) return `${base}: ${CHECK_LABELS[index as keyof typeof CHECK_LABELS] ?? index}`
  if (index && /^\d+$/.test(index)) return `${base}, line ${Number(index) + 1}${sub === 'howToTell' ? ' (how to tell)' : ''}`
  return base
}

/** The content keys of a type, in the order forms and diffs show them. */
export function wikiContentKeys<T extends WikiEntryType>(type: T): (keyof WikiContentByType[T] & string)[] {
  return Object.keys(WIKI_FIELD_LABELS[type]) as (keyof WikiContentByType[T] & string)[]
}

/** A deep copy of plain JSON data (drafts must never share arrays with the loaded entry). */
export function wikiClone<T>(value: T): T {
  return JSON.parse(JSON.stringify(value)) as T
}

function stable(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(stable).join(',')}]`
  if (value && typeof value === 'object') {
    return `{${Object.keys(value).sort().map(k => `${JSON.stringify(k)}:${stable((value as Record<string, unknown>)[k])}`).join(',')}}`
  }
  return JSON.stringify(value ?? null)
}

/** Equality of two field values as the server compares them (key order does not matter). */
export function wikiSameValue(a: unknown, b: unknown): boolean {
  return stable(a) === stable(b)
}

/** The editable content of an entry as the API sent it (its read-only extras left out). */
export function wikiContentOf<T extends WikiEntryType>(type: T, entry: WikiEntryByType[T]): WikiContentByType[T] {
  const source = entry as unknown as Record<string, unknown>
  const out: Record<string, unknown> = {}
  for (const key of wikiContentKeys(type)) out[key] = wikiClone(source[key] ?? (WIKI_EMPTY[type] as Record<string, unknown>)[key])
  if (type === 'mark') {
    out.lookalikes = ((source.lookalikes ?? []) as { markId: number, howToTell: string }[]).map(l => ({ markId: l.markId, howToTell: l.howToTell }))
  }
  if (type === 'material') out.checks = { ...EMPTY_MATERIAL.checks, ...(source.checks as object) }
  return out as WikiContentByType[T]
}

/** Names of the entries an entry refers to, keyed "type:id", so forms and diffs can show names instead of ids. */
export function wikiRefLabels(entry: WikiEntryByType[WikiEntryType]): Record<string, string> {
  const out: Record<string, string> = {}
  out[`${entry.type}:${entry.id}`] = entry.title
  if (entry.type === 'mark') {
    if (entry.maker) out[`maker:${entry.maker.id}`] = entry.maker.name
    for (const m of entry.materials) out[`material:${m.id}`] = m.name
    for (const c of entry.categories) out[`category:${c.id}`] = c.name
    for (const l of entry.lookalikes) out[`mark:${l.markId}`] = l.title
  }
  if (entry.type === 'category' && entry.parent) out[`category:${entry.parent.id}`] = entry.parent.name
  return out
}

/** "1920–1965", "c. 1920–1965", "from 1950", "until 1970", or "" when undated (as the server words it). */
export function wikiYears(from: number | null, to: number | null, fromApprox = false, toApprox = false): string {
  const f = from === null ? '' : `${fromApprox ? 'c. ' : ''}${from}`
  const t = to === null ? '' : `${toApprox ? 'c. ' : ''}${to}`
  if (!f && !t) return ''
  if (f && t) return f === t ? f : `${f}–${t}`
  return f ? `from ${f}` : `until ${t}`
}

export const WIKI_EMPTY_VALUE = '(empty)'

/** A field's value as plain text, one item per line, for the merge screen and the history diff. */
export function wikiValueText(type: WikiEntryType, key: string, value: unknown, labels: Record<string, string> = {}): string {
  const ref = (refType: WikiEntryType, id: number) => labels[`${refType}:${id}`] ?? `${WIKI_TYPE_META[refType].noun} #${id}`
  if (value === null || value === undefined || value === '') return WIKI_EMPTY_VALUE
  if (Array.isArray(value) && !value.length) return WIKI_EMPTY_VALUE
  switch (`${type}.${key}`) {
    case 'mark.makerId': return ref('maker', value as number)
    case 'category.parentId': return ref('category', value as number)
    case 'mark.materialIds': return (value as number[]).map(id => ref('material', id)).join('\n')
    case 'mark.categoryIds': return (value as number[]).map(id => ref('category', id)).join('\n')
    case 'mark.markType': return MARK_TYPE_LABELS[value as MarkType] ?? String(value)
    case 'mark.dateConfidence': return DATE_CONFIDENCE_LABELS[value as DateConfidence] ?? String(value)
    case 'mark.lookalikes':
      return (value as { markId: number, howToTell: string }[])
        .map(l => `${ref('mark', l.markId)}: ${l.howToTell || 'no "how to tell" yet'}`).join('\n')
    case 'material.checks': {
      const checks = value as Record<string, string>
      const lines = MATERIAL_CHECK_KEYS.filter(k => checks[k]).map(k => `${CHECK_LABELS[k]}: ${checks[k]}`)
      return lines.length ? lines.join('\n') : WIKI_EMPTY_VALUE
    }
    case 'mark.tags':
    case 'maker.tags':
    case 'material.tags':
    case 'category.tags':
      return (value as string[]).join(', ')
  }
  if (typeof value === 'boolean') return value ? 'Yes' : 'No'
  if (Array.isArray(value)) return value.map(String).join('\n')
  return String(value)
}

/** Ids a content object refers to, by type, so their names can be looked up. */
export function wikiRefIds(type: WikiEntryType, content: Record<string, unknown>): { type: WikiEntryType, id: number }[] {
  const out: { type: WikiEntryType, id: number }[] = []
  if (type === 'mark') {
    if (typeof content.makerId === 'number') out.push({ type: 'maker', id: content.makerId })
    for (const id of (content.materialIds ?? []) as number[]) out.push({ type: 'material', id })
    for (const id of (content.categoryIds ?? []) as number[]) out.push({ type: 'category', id })
    for (const l of (content.lookalikes ?? []) as { markId: number }[]) out.push({ type: 'mark', id: l.markId })
  }
  if (type === 'category' && typeof content.parentId === 'number') out.push({ type: 'category', id: content.parentId })
  return out
}

export type WikiMergeOrigin = 'yours' | 'theirs' | 'both'

export interface WikiMergeField {
  key: string
  label: string
  /** Who changed the field since the revision the edit started from. */
  origin: WikiMergeOrigin
  yours: unknown
  saved: unknown
  /** Which side is picked at first: the side that changed it; yours when both did (typed text is never dropped silently). */
  initial: 'yours' | 'saved'
  /** Plain text fields can also be written anew from both versions. */
  editable: boolean
}

/** The fields where the person's version and the saved version differ, with who changed what since `base`. */
export function wikiMergeFields<T extends WikiEntryType>(type: T, base: WikiContentByType[T], yours: WikiContentByType[T], saved: WikiContentByType[T]): WikiMergeField[] {
  const b = base as Record<string, unknown>
  const y = yours as Record<string, unknown>
  const s = saved as Record<string, unknown>
  const out: WikiMergeField[] = []
  for (const key of wikiContentKeys(type)) {
    if (wikiSameValue(y[key], s[key])) continue
    const mine = !wikiSameValue(y[key], b[key])
    const theirs = !wikiSameValue(s[key], b[key])
    const origin: WikiMergeOrigin = mine && theirs ? 'both' : theirs ? 'theirs' : 'yours'
    out.push({
      key,
      label: wikiFieldLabel(type, key),
      origin,
      yours: y[key],
      saved: s[key],
      initial: origin === 'theirs' ? 'saved' : 'yours',
      editable: typeof (WIKI_EMPTY[type] as Record<string, unknown>)[key] === 'string',
    })
  }
  return out
}

/** The fields of `next` that differ from `from`: what a PATCH needs to send. */
export function wikiChangedContent<T extends WikiEntryType>(type: T, from: WikiContentByType[T], next: WikiContentByType[T]): Partial<WikiContentByType[T]> {
  const f = from as Record<string, unknown>
  const n = next as Record<string, unknown>
  const out: Record<string, unknown> = {}
  for (const key of wikiContentKeys(type)) if (!wikiSameValue(f[key], n[key])) out[key] = n[key]
  return out as Partial<WikiContentByType[T]>
}

/** The app path of a list with a query, dropping empty values. */
export function wikiListQuery(query: Record<string, unknown>): Record<string, string> {
  const out: Record<string, string> = {}
  for (const [k, v] of Object.entries(query)) if (v !== undefined && v !== null && v !== '') out[k] = String(v)
  return out
}
