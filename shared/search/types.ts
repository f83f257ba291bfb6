// What the search API answers, shared by the server, the search box and the results page.
export const SEARCH_TYPES = ['mark', 'maker', 'material', 'category', 'note'] as const
export type SearchType = typeof SEARCH_TYPES[number]

export const SEARCH_TYPE_LABELS: Record<SearchType, { one: string, many: string }> = {
  mark: { one: 'Mark', many: 'Marks' },
  maker: { one: 'Maker', many: 'Makers' },
  material: { one: 'Material', many: 'Materials' },
  category: { one: 'Category', many: 'Categories' },
  note: { one: 'Note', many: 'Notes' },
}

/** The indexed fields of every document type; a type leaves out the ones it does not have. */
export const SEARCH_FIELDS = ['inscriptions', 'title', 'maker', 'otherNames', 'country', 'tags', 'body'] as const
export type SearchField = typeof SEARCH_FIELDS[number]

export const SEARCH_FIELD_LABELS: Record<SearchField, string> = {
  inscriptions: 'inscription', title: 'title', maker: 'maker', otherNames: 'other name', country: 'country', tags: 'tag', body: 'text',
}

/** A piece of snippet text; `match` pieces are the words the query found (shown highlighted). */
export interface SearchSegment { text: string, match: boolean }
export interface SearchSnippet { field: SearchField, segments: SearchSegment[] }

export interface SearchHit {
  type: SearchType
  id: number
  title: string
  /** A short second line: maker, years and country of a mark, the entry a note is on ... */
  subtitle: string
  score: number
  /** Field → the words of the entry (as written there) the query matched. */
  matched: Partial<Record<SearchField, string[]>>
  snippet: SearchSnippet | null
  /** The entry's page in the app. */
  path: string
  thumbUrl?: string
}

export interface SearchResponse {
  hits: SearchHit[]
  total: number
  tookMs: number
  /** "index": the team's in-memory index answered; "database": it is still being built, MariaDB answered;
   * "device": no signal (or the server could not be reached), the copy on the phone answered (shared/offline). */
  source: 'index' | 'database' | 'device'
  /** "recent": the query was empty or one letter, so these are recent and popular entries instead. */
  mode: 'results' | 'recent'
}
