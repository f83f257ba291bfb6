// Reference wiki input rules, shared by the editor forms and the server so both show the same words.
import { z } from 'zod'
import { idParam, teamSlug } from './common'

export const WIKI_ENTRY_TYPES = ['mark', 'maker', 'material', 'category'] as const
export type WikiEntryType = typeof WIKI_ENTRY_TYPES[number]

/** The URL segment of each type, in the API (/api/teams/<team>/marks) and in app paths (/t/<team>/marks/<id>). */
export const WIKI_PATH_SEGMENTS: Record<WikiEntryType, string> = {
  mark: 'marks', maker: 'makers', material: 'materials', category: 'categories',
}

export const MARK_TYPES = ['printed', 'impressed', 'incised', 'underglaze', 'painted', 'moulded', 'paper_label', 'foil_label', 'other'] as const
export type MarkType = typeof MARK_TYPES[number]

export const DATE_CONFIDENCES = ['low', 'medium', 'high'] as const
export type DateConfidence = typeof DATE_CONFIDENCES[number]

export const MATERIAL_CHECK_KEYS = ['weight', 'sound', 'touch', 'seams', 'uvGlow', 'translucency'] as const
export type MaterialChecks = Record<typeof MATERIAL_CHECK_KEYS[number], string>

export const WIKI_LIMITS = {
  title: 200,
  inscription: 300,
  inscriptions: 12,
  notes: 50_000,
  tags: 20,
  tag: 40,
  otherNames: 30,
  shortText: 120,
  colour: 80,
  check: 1_000,
  howToTell: 2_000,
  lookalikes: 20,
  refs: 50,
  sources: 30,
  source: 300,
  handbookPath: 200,
  pageSize: 100,
  yearMin: 1,
  yearMax: 2100,
} as const

const L = WIKI_LIMITS

const title = (what: string) => z.string().trim()
  .min(1, `Enter a ${what}.`)
  .max(L.title, `A ${what} is at most ${L.title} characters.`)
const shortText = (what: string, max: number = L.shortText) => z.string().trim().max(max, `${what} is at most ${max} characters.`)
const markdown = (what: string) => z.string().max(L.notes, `${what} is at most ${L.notes.toLocaleString('en')} characters.`)
const year = (what: string) => z.number({ message: `${what} must be a year, like 1954.` }).int(`${what} must be a whole year.`)
  .min(L.yearMin, `${what} must be a year from ${L.yearMin} to ${L.yearMax}.`)
  .max(L.yearMax, `${what} must be a year from ${L.yearMin} to ${L.yearMax}.`)
  .nullable()
const entryId = z.number({ message: 'Expected an entry id (a number).' }).int().positive().max(Number.MAX_SAFE_INTEGER)
const unique = <T>(values: T[]) => [...new Set(values)]

/** Tags are lower-cased and de-duplicated, so "Glass" and "glass " are one tag. */
export const tagList = z.array(
  z.string().trim().toLowerCase().min(1, 'Tags cannot be empty.').max(L.tag, `A tag is at most ${L.tag} characters.`),
).max(L.tags, `At most ${L.tags} tags.`).transform(unique)

const idList = (what: string) => z.array(entryId).max(L.refs, `At most ${L.refs} ${what}.`).transform(ids => unique(ids).sort((a, b) => a - b))
const textList = (what: string, maxItems: number, maxLength: number) => z.array(
  z.string().trim().min(1, `${what} cannot be empty.`).max(maxLength, `${what} is at most ${maxLength} characters.`),
).max(maxItems, `At most ${maxItems} entries in ${what.toLowerCase()}.`).transform(unique)

const revision = z.number({ message: 'Send the revision your edit is based on.' }).int().positive()

// ---- Makers
const makerFields = {
  name: title('name'),
  otherNames: textList('Other names', L.otherNames, L.title),
  country: shortText('Country'),
  yearFrom: year('yearFrom'),
  yearFromApprox: z.boolean(),
  yearTo: year('yearTo'),
  yearToApprox: z.boolean(),
  notes: markdown('Notes'),
  tags: tagList,
}
export const makerContentSchema = z.object(makerFields)
export const makerCreateSchema = z.object(makerFields).partial().required({ name: true })
export const makerPatchSchema = z.object(makerFields).partial().extend({ revision })
export type MakerContent = z.infer<typeof makerContentSchema>
export const EMPTY_MAKER: MakerContent = {
  name: '', otherNames: [], country: '', yearFrom: null, yearFromApprox: false, yearTo: null, yearToApprox: false, notes: '', tags: [],
}

// ---- Marks
const lookalike = z.object({
  markId: entryId,
  howToTell: z.string().trim().max(L.howToTell, `"How to tell" is at most ${L.howToTell} characters.`),
})
const markFields = {
  // Optional: a mark without a title is called by its first inscription.
  title: z.string().trim().max(L.title, `A title is at most ${L.title} characters.`),
  makerId: entryId.nullable(),
  inscriptions: z.array(
    z.string().trim().min(1, 'An inscription cannot be empty.').max(L.inscription, `An inscription is at most ${L.inscription} characters.`),
  ).min(1, 'Enter at least one inscription, exactly as on the base.').max(L.inscriptions, `At most ${L.inscriptions} inscriptions.`),
  markType: z.enum(MARK_TYPES, { message: `markType must be one of: ${MARK_TYPES.join(', ')}.` }).nullable(),
  colour: shortText('Colour', L.colour),
  position: shortText('Position'),
  country: shortText('Country'),
  yearFrom: year('yearFrom'),
  yearTo: year('yearTo'),
  dateConfidence: z.enum(DATE_CONFIDENCES, { message: `dateConfidence must be one of: ${DATE_CONFIDENCES.join(', ')}.` }).nullable(),
  materialIds: idList('materials'),
  categoryIds: idList('categories'),
  lookalikes: z.array(lookalike).max(L.lookalikes, `At most ${L.lookalikes} lookalikes.`)
    .refine(list => new Set(list.map(l => l.markId)).size === list.length, 'Each lookalike mark can be listed once.'),
  notes: markdown('Notes'),
  tags: tagList,
}
export const markContentSchema = z.object(markFields)
export const markCreateSchema = z.object(markFields).partial().required({ inscriptions: true })
export const markPatchSchema = z.object(markFields).partial().extend({ revision })
export type MarkContent = z.infer<typeof markContentSchema>
export const EMPTY_MARK: MarkContent = {
  title: '', makerId: null, inscriptions: [], markType: null, colour: '', position: '', country: '', yearFrom: null, yearTo: null,
  dateConfidence: null, materialIds: [], categoryIds: [], lookalikes: [], notes: '', tags: [],
}

// ---- Materials
const check = z.string().trim().max(L.check, `A check is at most ${L.check} characters.`)
const materialFields = {
  name: title('name'),
  recognition: markdown('Recognition'),
  checks: z.object({
    weight: check.optional(), sound: check.optional(), touch: check.optional(),
    seams: check.optional(), uvGlow: check.optional(), translucency: check.optional(),
  }).transform((c): MaterialChecks => ({
    weight: c.weight ?? '', sound: c.sound ?? '', touch: c.touch ?? '',
    seams: c.seams ?? '', uvGlow: c.uvGlow ?? '', translucency: c.translucency ?? '',
  })),
  damage: markdown('Damage'),
  cautions: markdown('Cautions'),
  handbookPath: z.string().trim().max(L.handbookPath, `handbookPath is at most ${L.handbookPath} characters.`)
    .regex(/^(?:\/(?!\/)[\w\-/]*)?$/, 'handbookPath is an app path like /handbook/materials/glass.'),
  sources: textList('Sources', L.sources, L.source),
  notes: markdown('Notes'),
  tags: tagList,
}
export const materialContentSchema = z.object(materialFields)
export const materialCreateSchema = z.object(materialFields).partial().required({ name: true })
export const materialPatchSchema = z.object(materialFields).partial().extend({ revision })
export type MaterialContent = z.infer<typeof materialContentSchema>
export const EMPTY_MATERIAL: MaterialContent = {
  name: '', recognition: '', checks: { weight: '', sound: '', touch: '', seams: '', uvGlow: '', translucency: '' },
  damage: '', cautions: '', handbookPath: '', sources: [], notes: '', tags: [],
}

// ---- Categories
const categoryFields = {
  parentId: entryId.nullable(),
  name: title('name'),
  notes: markdown('Notes'),
  tags: tagList,
}
export const categoryContentSchema = z.object(categoryFields)
export const categoryCreateSchema = z.object(categoryFields).partial().required({ name: true })
export const categoryPatchSchema = z.object(categoryFields).partial().extend({ revision })
export type CategoryContent = z.infer<typeof categoryContentSchema>
export const EMPTY_CATEGORY: CategoryContent = { parentId: null, name: '', notes: '', tags: [] }

export interface WikiContentByType {
  mark: MarkContent
  maker: MakerContent
  material: MaterialContent
  category: CategoryContent
}

// ---- Lists
export const MARK_SORTS = ['title', 'country', 'markType', 'yearFrom', 'yearTo', 'createdAt', 'updatedAt'] as const
export const MAKER_SORTS = ['name', 'country', 'yearFrom', 'yearTo', 'createdAt', 'updatedAt'] as const
export const MATERIAL_SORTS = ['name', 'createdAt', 'updatedAt'] as const
export const CATEGORY_SORTS = ['name', 'createdAt', 'updatedAt'] as const

function sortParam<const F extends readonly string[]>(fields: F) {
  const allowed = [...fields, ...fields.map(f => `-${f}`)] as unknown as [F[number] | `-${F[number]}`, ...(F[number] | `-${F[number]}`)[]]
  return z.enum(allowed, { message: `sort must be one of: ${fields.join(', ')} (prefix - for descending).` }).optional()
}

const page = z.coerce.number().int('page must be a whole number.').min(1, 'page starts at 1.').max(1_000_000).default(1)
const pageSize = z.coerce.number().int('pageSize must be a whole number.').min(1, 'pageSize is at least 1.')
  .max(L.pageSize, `pageSize is at most ${L.pageSize}.`).default(25)
const queryText = z.string().trim().max(200, 'The search text is at most 200 characters.').optional()
const queryId = idParam.optional()

const listBase = { page, pageSize, q: queryText, tag: z.string().trim().toLowerCase().max(L.tag).optional() }

export const markListQuery = z.object({
  ...listBase,
  sort: sortParam(MARK_SORTS),
  makerId: queryId,
  country: queryText,
  markType: z.enum(MARK_TYPES, { message: `markType must be one of: ${MARK_TYPES.join(', ')}.` }).optional(),
  materialId: queryId,
  categoryId: queryId,
  year: z.coerce.number().int().min(L.yearMin).max(L.yearMax).optional(),
})
export const makerListQuery = z.object({ ...listBase, sort: sortParam(MAKER_SORTS), country: queryText })
export const materialListQuery = z.object({ ...listBase, sort: sortParam(MATERIAL_SORTS) })
export const categoryListQuery = z.object({
  ...listBase,
  sort: sortParam(CATEGORY_SORTS),
  // "root" lists the top-level categories.
  parentId: z.union([z.literal('root'), idParam]).optional(),
})
export type MarkListQuery = z.infer<typeof markListQuery>
export type MakerListQuery = z.infer<typeof makerListQuery>
export type MaterialListQuery = z.infer<typeof materialListQuery>
export type CategoryListQuery = z.infer<typeof categoryListQuery>

const flag = z.enum(['1', '0', 'true', 'false']).optional().transform(v => v === '1' || v === 'true')
export const wikiReadQuery = z.object({ includeDeleted: flag })
export const wikiDeleteQuery = z.object({ purge: flag })

const lookupTypes = z.string().max(200).optional().transform((raw, ctx) => {
  if (!raw) return [...WIKI_ENTRY_TYPES]
  const out = new Set<WikiEntryType>()
  for (const part of raw.split(',').map(p => p.trim()).filter(Boolean)) {
    // Both "mark" and "marks" are accepted.
    const type = WIKI_ENTRY_TYPES.find(t => t === part || WIKI_PATH_SEGMENTS[t] === part)
    if (!type) {
      ctx.addIssue({ code: 'custom', message: `types must be a comma-separated list of: ${WIKI_ENTRY_TYPES.join(', ')}.` })
      return z.NEVER
    }
    out.add(type)
  }
  return [...out]
})
export const wikiLookupQuery = z.object({ q: z.string().trim().max(200).default(''), types: lookupTypes })

// ---- Revisions and notes
export const wikiRestoreSchema = z.object({ revision: revision.optional() })

export const noteCreateSchema = z.object({
  body: z.string().trim().min(1, 'Write something in the note.').max(L.notes, `A note is at most ${L.notes.toLocaleString('en')} characters.`),
  happenedOn: z.iso.date({ message: 'happenedOn is a date like 2026-03-14.' }).nullable().optional(),
})
export const notePatchSchema = noteCreateSchema.partial()
export type NoteCreateInput = z.infer<typeof noteCreateSchema>
export type NotePatchInput = z.infer<typeof notePatchSchema>

export const wikiEntryParams = z.object({ team: teamSlug, id: idParam })
export const wikiRevisionParams = z.object({ team: teamSlug, id: idParam, rev: idParam })
export const wikiNoteParams = z.object({ team: teamSlug, id: idParam, noteId: idParam })
