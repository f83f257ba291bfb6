// The categories under one or more categories, as the recursive CTE `cat_filter (id, depth)`: shared by the item
// filters, the reports and the buy check, so "with its subcategories" means the same everywhere. Deleted
// categories count (their items are still filed there). Plain imports only: the reports benchmark runs it directly.
import { sql, type SQL } from 'drizzle-orm'

/** Longest category chain followed, against a loop that a concurrent move could leave for a moment. */
export const MAX_CATEGORY_DEPTH = 64

/** `cat_filter (id, depth) AS (…)`, to put after WITH RECURSIVE: the given categories and all below them. */
export function categorySubtreeCte(teamId: number, categoryIds: number[]): SQL {
  const ids = sql.join(categoryIds.map(id => sql`${id}`), sql`, `)
  return sql`cat_filter (id, depth) AS (
      SELECT c.id, 0 FROM categories c WHERE c.team_id = ${teamId} AND c.id IN (${ids})
      UNION ALL
      SELECT c.id, f.depth + 1 FROM categories c JOIN cat_filter f ON c.parent_id = f.id
      WHERE c.team_id = ${teamId} AND f.depth < ${MAX_CATEGORY_DEPTH})`
}
