// The reference wiki: makers, marks, materials and categories, with revisions, timeline notes and links.
// Every table is team-owned; every index starts with team_id so each query stays inside one team.
import { boolean, date, index, int, json, mediumtext, mysqlEnum, mysqlTable, primaryKey, smallint, text, uniqueIndex, varchar } from 'drizzle-orm/mysql-core'
import { createdAt, id, ref, teamId, teamVersionColumns, timestamps, utcDatetime } from './columns'
import { DATE_CONFIDENCES, MARK_TYPES, WIKI_ENTRY_TYPES } from '../../../shared/schemas/wiki'
import type { MaterialChecks } from '../../../shared/schemas/wiki'

// Columns every entry shares: the revision counter behind optimistic concurrency, authorship and soft delete.
const entryColumns = () => ({
  id: id(),
  teamId: teamId(),
  revision: int('revision').notNull().default(1),
  tags: json('tags').$type<string[]>().notNull(),
  notes: mediumtext('notes').notNull(),
  createdBy: ref('created_by').notNull(),
  updatedBy: ref('updated_by').notNull(),
  deletedAt: utcDatetime('deleted_at'),
  deletedBy: ref('deleted_by'),
  ...timestamps(),
})

export const makers = mysqlTable('makers', {
  ...entryColumns(),
  name: varchar('name', { length: 200 }).notNull(),
  otherNames: json('other_names').$type<string[]>().notNull(),
  country: varchar('country', { length: 120 }).notNull().default(''),
  yearFrom: smallint('year_from'),
  yearFromApprox: boolean('year_from_approx').notNull().default(false),
  yearTo: smallint('year_to'),
  yearToApprox: boolean('year_to_approx').notNull().default(false),
}, t => [
  index('makers_team_name_idx').on(t.teamId, t.name),
  index('makers_team_deleted_idx').on(t.teamId, t.deletedAt),
])

export const marks = mysqlTable('marks', {
  ...entryColumns(),
  title: varchar('title', { length: 200 }).notNull(),
  makerId: ref('maker_id'),
  markType: mysqlEnum('mark_type', MARK_TYPES),
  colour: varchar('colour', { length: 80 }).notNull().default(''),
  position: varchar('position', { length: 120 }).notNull().default(''),
  country: varchar('country', { length: 120 }).notNull().default(''),
  yearFrom: smallint('year_from'),
  yearTo: smallint('year_to'),
  dateConfidence: mysqlEnum('date_confidence', DATE_CONFIDENCES),
}, t => [
  index('marks_team_title_idx').on(t.teamId, t.title),
  index('marks_team_maker_idx').on(t.teamId, t.makerId),
  index('marks_team_deleted_idx').on(t.teamId, t.deletedAt),
])

// One row per inscription, in base order, so LIKE (and a FULLTEXT index later) can search the text.
export const markInscriptions = mysqlTable('mark_inscriptions', {
  id: id(),
  teamId: teamId(),
  markId: ref('mark_id').notNull(),
  position: smallint('position').notNull(),
  text: varchar('text', { length: 300 }).notNull(),
}, t => [
  index('mark_inscriptions_team_mark_idx').on(t.teamId, t.markId, t.position),
  index('mark_inscriptions_team_text_idx').on(t.teamId, t.text),
])

export const markMaterials = mysqlTable('mark_materials', {
  teamId: teamId(),
  markId: ref('mark_id').notNull(),
  materialId: ref('material_id').notNull(),
}, t => [
  primaryKey({ columns: [t.teamId, t.markId, t.materialId] }),
  index('mark_materials_team_material_idx').on(t.teamId, t.materialId),
])

export const markCategories = mysqlTable('mark_categories', {
  teamId: teamId(),
  markId: ref('mark_id').notNull(),
  categoryId: ref('category_id').notNull(),
}, t => [
  primaryKey({ columns: [t.teamId, t.markId, t.categoryId] }),
  index('mark_categories_team_category_idx').on(t.teamId, t.categoryId),
])

// One row per pair, lower mark id first: the pair is shown from both sides.
export const markLookalikes = mysqlTable('mark_lookalikes', {
  teamId: teamId(),
  markLowId: ref('mark_low_id').notNull(),
  markHighId: ref('mark_high_id').notNull(),
  howToTell: text('how_to_tell').notNull(),
}, t => [
  primaryKey({ columns: [t.teamId, t.markLowId, t.markHighId] }),
  index('mark_lookalikes_team_high_idx').on(t.teamId, t.markHighId),
])

export const materials = mysqlTable('materials', {
  ...entryColumns(),
  name: varchar('name', { length: 200 }).notNull(),
  recognition: mediumtext('recognition').notNull(),
  checks: json('checks').$type<MaterialChecks>().notNull(),
  damage: mediumtext('damage').notNull(),
  cautions: mediumtext('cautions').notNull(),
  handbookPath: varchar('handbook_path', { length: 200 }).notNull().default(''),
  sources: json('sources').$type<string[]>().notNull(),
}, t => [
  index('materials_team_name_idx').on(t.teamId, t.name),
  index('materials_team_deleted_idx').on(t.teamId, t.deletedAt),
])

export const categories = mysqlTable('categories', {
  ...entryColumns(),
  parentId: ref('parent_id'),
  name: varchar('name', { length: 200 }).notNull(),
}, t => [
  index('categories_team_parent_idx').on(t.teamId, t.parentId),
  index('categories_team_name_idx').on(t.teamId, t.name),
  index('categories_team_deleted_idx').on(t.teamId, t.deletedAt),
])

// The full content of an entry after each create, edit or restore: nothing an edit replaces is lost.
export const entryRevisions = mysqlTable('entry_revisions', {
  id: id(),
  teamId: teamId(),
  entryType: mysqlEnum('entry_type', WIKI_ENTRY_TYPES).notNull(),
  entryId: ref('entry_id').notNull(),
  revision: int('revision').notNull(),
  action: mysqlEnum('action', ['create', 'edit', 'restore']).notNull(),
  restoredFrom: int('restored_from'),
  changedFields: json('changed_fields').$type<string[]>().notNull(),
  snapshot: json('snapshot').$type<Record<string, unknown>>().notNull(),
  authorId: ref('author_id').notNull(),
  createdAt: createdAt(),
}, t => [
  // Unique: two writers can never both record the same revision of an entry.
  uniqueIndex('entry_revisions_entry_unique').on(t.teamId, t.entryType, t.entryId, t.revision),
])

// Markdown links between entries, rewritten on every save of the linking entry; read as backlinks.
export const entryLinks = mysqlTable('entry_links', {
  teamId: teamId(),
  fromType: mysqlEnum('from_type', WIKI_ENTRY_TYPES).notNull(),
  fromId: ref('from_id').notNull(),
  toType: mysqlEnum('to_type', WIKI_ENTRY_TYPES).notNull(),
  toId: ref('to_id').notNull(),
}, t => [
  primaryKey({ columns: [t.teamId, t.fromType, t.fromId, t.toType, t.toId] }),
  index('entry_links_team_to_idx').on(t.teamId, t.toType, t.toId),
])

// The dated timeline under every entry: what a member saw, sold or learnt, in their own words.
export const entryNotes = mysqlTable('entry_notes', {
  id: id(),
  teamId: teamId(),
  entryType: mysqlEnum('entry_type', WIKI_ENTRY_TYPES).notNull(),
  entryId: ref('entry_id').notNull(),
  authorId: ref('author_id').notNull(),
  body: mediumtext('body').notNull(),
  happenedOn: date('happened_on', { mode: 'string' }),
  ...timestamps(),
}, t => [
  index('entry_notes_team_entry_idx').on(t.teamId, t.entryType, t.entryId, t.createdAt),
])

// A counter per team that every write to what an entry page shows moves on, in that write's own transaction:
// an instance answers a page it built earlier only while the counter still reads the same (utils/wiki/page-cache.ts).
export const wikiVersions = mysqlTable('wiki_versions', teamVersionColumns())
