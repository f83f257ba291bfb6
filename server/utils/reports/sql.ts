// The SQL behind the reports, the entry outcomes, the sourcing sheet and the buy check. Every figure is
// aggregated by MariaDB; the server only shapes the grouped rows. Plain imports only (no Nitro auto-imports),
// so the benchmark (scripts/bench/reports.ts) runs exactly these statements against the database directly.
//
// Quartiles are Hyndman & Fan type 7 (R's default), the method of shared/ledger/stats.ts quartilesCents,
// computed exactly: for quartile j of n sorted values x[1..n] the quarter step s = (n − 1)·j gives lo = s DIV 4
// and k = s MOD 4, and a statement returns x[lo + 1]·(4 − k) + x[lo + 2]·k. That is four times the quartile, a
// whole number, which the server rounds half-up to the cent with the ledger's roundHalfUp (so the figures equal
// quartilesCents of the same prices). PERCENTILE_CONT gives the same interpolation, but as a DOUBLE and slower.
// x[r] is reached three ways, each where it measured cheapest: within report groups, from sorted lists
// (GROUP_CONCAT … ORDER BY); over all of a report's sales, from a histogram with running counts; over the buy
// check's few hundred sales, from ROW_NUMBER() windows.
import { sql, type SQL } from 'drizzle-orm'
import type { ReportDimension } from '../../../shared/schemas/reports'
import { categorySubtreeCte, MAX_CATEGORY_DEPTH } from '../ledger/category-subtree'

/** Statuses that carry a sale still standing. A returned item's sale was given back. */
const SOLD = sql.raw(`('sold','shipped')`)
/** Statuses still for sale: they never carry a sale date (shared/ledger/item-rules.ts checkItemConsistency). */
const OPEN = sql.raw(`('in_stock','listed')`)
/** End states without a sale: their day is only in the status history, so they leave the stock base. */
const GONE = sql.raw(`('donated','written_off','kept')`)

export interface ReportSqlFilters {
  from?: string | null
  to?: string | null
  categoryId?: number | null
  storeId?: number | null
  memberId?: number | null
  channel?: number | null
  condition?: string | null
  // Category dimension: the parent whose children are the rows.
  parentId?: number | null
  // Entry outcomes: one entry's items.
  markId?: number | null
  makerId?: number | null
  materialId?: number | null
}

export interface ReportSqlInput {
  teamId: number
  dimension: ReportDimension
  filters: ReportSqlFilters
  /** The last day of the period that has happened: min(to, today). Ages of unsold stock are counted to it. */
  ageDay: string
}

/** The month report's series: first and last month shown (yyyy-mm-01). */
export interface ReportMonthRange { first: string, last: string }

function withClause(input: ReportSqlInput, grouped: boolean): SQL {
  const { teamId, dimension, filters } = input
  const ctes: SQL[] = []
  if (filters.categoryId) {
    ctes.push(categorySubtreeCte(teamId, [filters.categoryId]))
  }
  if (dimension === 'category' && (grouped || filters.parentId)) {
    // Each category mapped to the row it rolls up into: its top-level ancestor, or the requested parent's
    // child it sits under (the parent itself is a row of its own, for items filed directly in it).
    ctes.push(filters.parentId
      ? sql`cat_tree (id, grp, depth) AS (
          SELECT c.id, c.id, 0 FROM categories c WHERE c.team_id = ${teamId} AND c.parent_id = ${filters.parentId}
          UNION ALL
          SELECT c.id, c.id, 0 FROM categories c WHERE c.team_id = ${teamId} AND c.id = ${filters.parentId}
          UNION ALL
          SELECT c.id, t.grp, t.depth + 1 FROM categories c JOIN cat_tree t ON c.parent_id = t.id
          WHERE c.team_id = ${teamId} AND t.id <> ${filters.parentId} AND t.depth < ${MAX_CATEGORY_DEPTH})`
      : sql`cat_tree (id, grp, depth) AS (
          SELECT c.id, c.id, 0 FROM categories c
          WHERE c.team_id = ${teamId} AND (c.parent_id IS NULL
            OR NOT EXISTS (SELECT 1 FROM categories p WHERE p.team_id = ${teamId} AND p.id = c.parent_id))
          UNION ALL
          SELECT c.id, t.grp, t.depth + 1 FROM categories c JOIN cat_tree t ON c.parent_id = t.id
          WHERE c.team_id = ${teamId} AND t.depth < ${MAX_CATEGORY_DEPTH})`)
  }
  return ctes.length ? sql`WITH RECURSIVE ${sql.join(ctes, sql`, `)} ` : sql``
}

/** Covering indexes of migration 0007_reports_items_indexes that a statement names when the planner misses them. */
type ReportIndex = 'items_report_sold_idx' | 'items_report_acquired_idx' | 'items_report_listed_idx'

/** FROM items with the joins the grouping needs, and WHERE with the filters (never without team_id). */
function fromWhere(input: ReportSqlInput, grouped: boolean, extra: SQL[] = [], index?: ReportIndex): SQL {
  const { teamId, dimension, filters } = input
  const where: SQL[] = [sql`i.team_id = ${teamId}`]
  if (filters.categoryId) where.push(sql`i.category_id IN (SELECT id FROM cat_filter)`)
  if (filters.storeId) where.push(sql`i.store_id = ${filters.storeId}`)
  if (filters.memberId) where.push(sql`i.sourced_by = ${filters.memberId}`)
  if (filters.channel) where.push(sql`i.fee_profile_id = ${filters.channel}`)
  if (filters.condition) where.push(sql`i.condition_grade = ${filters.condition}`)
  if (filters.markId) where.push(sql`i.mark_id = ${filters.markId}`)
  if (filters.makerId) where.push(sql`i.maker_id = ${filters.makerId}`)
  if (filters.materialId) where.push(sql`i.material_id = ${filters.materialId}`)
  where.push(...extra)
  let join = sql``
  if (dimension === 'category' && (grouped || filters.parentId)) {
    // With a parent, only the items under it belong to the report.
    join = filters.parentId ? sql` JOIN cat_tree ct ON ct.id = i.category_id` : sql` LEFT JOIN cat_tree ct ON ct.id = i.category_id`
  }
  const hint = index ? sql.raw(` FORCE INDEX (${index})`) : sql``
  return sql`FROM items i${hint}${join} WHERE ${sql.join(where, sql` AND `)}`
}

/** The item column a dimension groups by (before any category roll-up). */
function rawKeyColumn(dimension: Exclude<ReportDimension, 'month'>): SQL {
  return dimension === 'category' ? sql.raw('i.category_id') : groupExpression(dimension)
}

/** The group of an item for a dimension other than month (NULL: the item has none). */
function groupExpression(dimension: Exclude<ReportDimension, 'month'>): SQL {
  switch (dimension) {
    case 'category': return sql.raw('ct.grp')
    case 'mark': return sql.raw('i.mark_id')
    case 'maker': return sql.raw('i.maker_id')
    case 'material': return sql.raw('i.material_id')
    case 'store': return sql.raw('i.store_id')
    case 'member': return sql.raw('i.sourced_by')
  }
}

function periodBounds(filters: ReportSqlFilters) {
  return {
    fromDay: filters.from ?? null,
    // No end given: everything recorded so far (a far date keeps the SQL one shape).
    toDay: filters.to ?? '9999-12-31',
  }
}

const inPeriod = (column: SQL, fromDay: string | null, toDay: string): SQL =>
  fromDay === null ? sql`${column} <= ${toDay}` : sql`${column} BETWEEN ${fromDay} AND ${toDay}`

/**
 * The counts and sums of every group, and with `grouped` also the totals of all groups as the WITH ROLLUP row
 * (group NULL; items without a group come back as group 0): bought, listed and sold in the period, the stock base
 * of sell-through, revenue, net, the cost of what sold, and the stock unsold at the end of the period with the sum
 * of its ages in days.
 *
 * Two steps, for speed: the inner SELECT groups the items by the raw column (mark_id, category_id …) and status,
 * which the reports' covering indexes deliver in order (no temporary table; migration 0007_reports_items_indexes),
 * with only date tests per row; the outer one applies the status rules and the category roll-up to those few rows.
 * Items sold before the period starts, or bought after it ends, can count in no figure, so they are not read.
 */
export function reportCountsSql(input: ReportSqlInput, grouped = true): SQL {
  if (input.dimension === 'month' && grouped) throw new Error('reportCountsSql: the month report has its own statement')
  const { fromDay, toDay } = periodBounds(input.filters)
  const ends = Boolean(input.filters.to)
  const extra: SQL[] = []
  if (fromDay !== null) extra.push(sql`(i.sold_on IS NULL OR i.sold_on >= ${fromDay})`)
  if (ends) extra.push(sql`i.acquired_on <= ${toDay}`)
  // Within the rows read, a sale date is in the period unless it is after its end; without an end every figure
  // below is a plain sum, and the status rules of the outer SELECT pick the rows each figure needs.
  const soldIn = sql`i.sold_on <= ${toDay}`
  const ifSold = (value: SQL) => ends ? sql`SUM(IF(${soldIn}, ${value}, 0))` : sql`SUM(${value})`
  const unsoldAt = sql`(i.sold_on IS NULL OR i.sold_on > ${toDay})`
  const dimension = input.dimension as Exclude<ReportDimension, 'month'>
  const rollsUp = dimension === 'category' && (grouped || Boolean(input.filters.parentId))
  const groupKey = !grouped ? null : rollsUp ? sql.raw('COALESCE(ct.grp, 0)') : sql.raw('COALESCE(x.k, 0)')
  const join = !rollsUp ? sql`` : input.filters.parentId ? sql` JOIN cat_tree ct ON ct.id = x.k` : sql` LEFT JOIN cat_tree ct ON ct.id = x.k`
  // Only the sums a figure needs, each once: without a start, bought is the row count; without an end, every
  // item sold or shipped that was read sold in the period, and the unsold stock is the open items with their cost.
  const inner = sql`SELECT ${grouped || rollsUp ? rawKeyColumn(dimension) : sql.raw('0')} AS k, i.status AS st,
      COUNT(*) AS n,
      ${fromDay === null ? sql`` : sql`SUM(i.acquired_on >= ${fromDay}) AS bought,`}
      ${fromDay === null && !ends ? sql`COUNT(i.listed_on)` : sql`SUM(${inPeriod(sql.raw('i.listed_on'), fromDay, toDay)})`} AS listed,
      ${ends ? sql`SUM(${soldIn}) AS sold_n,` : sql``}
      ${ifSold(sql`i.sale_price_cents + COALESCE(i.shipping_charged_cents, 0)`)} AS revenue,
      ${ifSold(sql`i.net_profit_cents`)} AS net,
      ${ifSold(sql`i.cost_cents`)} AS cost,
      ${ends ? sql`SUM(${unsoldAt}) AS unsold_n, SUM(IF(${unsoldAt}, i.cost_cents, 0)) AS unsold_cost,` : sql``}
      SUM(${ends ? sql`IF(${unsoldAt}, TO_DAYS(i.acquired_on), 0)` : sql`TO_DAYS(i.acquired_on)`}) AS acquired_days
    ${fromWhere(input, false, extra)} GROUP BY k, st`
  const sold = sql`x.st IN ${SOLD}`
  const live = sql`x.st NOT IN ${GONE}`
  // Without an end, the unsold stock is the items in stock or listed (they carry no sale date).
  const holds = ends ? live : sql`x.st IN ${OPEN}`
  const unsoldN = ends ? sql`x.unsold_n` : sql`x.n`
  const bought = fromDay === null ? sql`x.n` : sql`x.bought`
  return sql`${withClause(input, rollsUp)}SELECT ${groupKey ?? sql.raw('0')} AS g,
    SUM(${bought}) AS bought, SUM(x.listed) AS listed,
    SUM(IF(${sold}, ${ends ? sql`x.sold_n` : sql`x.n`}, 0)) AS sold, SUM(IF(${sold}, x.revenue, 0)) AS revenue, SUM(IF(${sold}, x.net, 0)) AS net,
    SUM(IF(${sold}, x.cost, 0)) AS sold_cost,
    ${fromDay === null ? sql`0` : sql`SUM(IF(${live}, x.n - x.bought, 0))`} AS on_start,
    SUM(IF(${holds}, ${unsoldN}, 0)) AS unsold, SUM(IF(${holds}, ${ends ? sql`x.unsold_cost` : sql`x.cost`}, 0)) AS unsold_cost,
    SUM(IF(${holds}, ${unsoldN} * TO_DAYS(${input.ageDay}) - x.acquired_days, 0)) AS unsold_age_days
    FROM (${inner}) AS x${join}${groupKey ? sql` GROUP BY ${groupKey} WITH ROLLUP HAVING bought > 0 OR listed > 0 OR sold > 0 OR on_start > 0 OR unsold > 0` : sql``}`
}

/**
 * x[lo + 1]·(4 − k) + x[lo + 2]·k for quartile j (see the header), over a ROW_NUMBER column and its count; `guard`
 * keeps only the rows of the partition the ranks were taken in (values that are present).
 */
function quartileTimesFour(value: string, rank: string, count: string, j: 1 | 2 | 3, guard = 'TRUE'): SQL {
  return sql.raw(`SUM(CASE WHEN NOT (${guard}) THEN 0 WHEN ${rank} = ((${count} - 1) * ${j}) DIV 4 + 1 THEN ${value} * (4 - MOD((${count} - 1) * ${j}, 4))`
    + ` WHEN ${rank} = ((${count} - 1) * ${j}) DIV 4 + 2 THEN ${value} * MOD((${count} - 1) * ${j}, 4) ELSE 0 END)`)
}

/** The r-th (1-based) of a comma-separated list of whole numbers. */
const nthOfList = (list: string, rank: string) => `CAST(SUBSTRING_INDEX(SUBSTRING_INDEX(${list}, ',', ${rank}), ',', -1) AS SIGNED)`

/** Four times quartile j of a sorted list of n whole numbers (see the header). */
function listQuartileTimesFour(list: string, n: string, j: 1 | 2 | 3): SQL {
  const lo = `((${n} - 1) * ${j}) DIV 4`
  const k = `MOD((${n} - 1) * ${j}, 4)`
  return sql.raw(`${nthOfList(list, `${lo} + 1`)} * (4 - ${k}) + IF(${k} > 0, ${nthOfList(list, `${lo} + 2`)}, 0) * ${k}`)
}

/**
 * Room for every list of sale prices of one group (a price is at most 11 characters and a comma): sorted lists
 * that stopped at the session's group_concat_max_len would give wrong quartiles without an error.
 */
const LIST_ROOM = sql.raw('SET STATEMENT group_concat_max_len = 1073741824 FOR ')

/**
 * Sale-price quartiles and the median days to sell of the items sold in the period, per group, each as four times
 * the figure (see the header). Each group's prices and days are gathered sorted by GROUP_CONCAT(… ORDER BY …), in
 * one pass over the sold items, and the ranks a quartile needs are read from those lists: sorting many small
 * lists costs MariaDB much less than numbering every sale with window functions.
 */
export function reportGroupSoldStatsSql(input: ReportSqlInput): SQL {
  const { fromDay, toDay } = periodBounds(input.filters)
  const g = input.dimension === 'month' ? sql.raw(`DATE_FORMAT(i.sold_on, '%Y-%m')`) : groupExpression(input.dimension)
  const sold = [sql`i.status IN ${SOLD}`, inPeriod(sql.raw('i.sold_on'), fromDay, toDay)]
  const joinsCategories = input.dimension !== 'month'
  return sql`${LIST_ROOM}${withClause(input, joinsCategories)}SELECT g, n,
    ${listQuartileTimesFour('prices', 'n', 1)} AS q1x4,
    ${listQuartileTimesFour('prices', 'n', 2)} AS q2x4,
    ${listQuartileTimesFour('prices', 'n', 3)} AS q3x4,
    ${listQuartileTimesFour('days', 'n', 2)} AS d2x4
    FROM (SELECT ${g} AS g, COUNT(*) AS n,
        GROUP_CONCAT(i.sale_price_cents ORDER BY i.sale_price_cents) AS prices,
        GROUP_CONCAT(DATEDIFF(i.sold_on, i.acquired_on) ORDER BY DATEDIFF(i.sold_on, i.acquired_on)) AS days
      ${fromWhere(input, joinsCategories, sold)} GROUP BY g) AS lists`
}

/**
 * The quartiles of one value over all the rows of a histogram `h` (columns v, c: a value and how many items have
 * it), each as four times the figure: x[r], the r-th smallest value, is the first value whose running count
 * reaches r. Sale prices repeat (whole and half dollars, the same tag again), so the histogram is far shorter than
 * the list of sales and numbering it is cheaper than numbering every sale.
 */
function histogramQuartilesSql(histogram: SQL, quartiles: (1 | 2 | 3)[]): SQL {
  const pick = (j: number, offset: 1 | 2) => `MIN(IF(cum >= ((n - 1) * ${j}) DIV 4 + ${offset}, v, NULL))`
  // x[lo + 2] is read only when the step falls between two ranks (k > 0), and then it exists.
  const timesFour = (j: number) => sql.raw(`${pick(j, 1)} * (4 - MOD((MAX(n) - 1) * ${j}, 4)) + COALESCE(${pick(j, 2)}, 0) * MOD((MAX(n) - 1) * ${j}, 4) AS x${j}`)
  return sql`SELECT MAX(n) AS n, ${sql.join(quartiles.map(timesFour), sql`, `)} FROM (
      SELECT v, SUM(c) OVER (ORDER BY v ROWS UNBOUNDED PRECEDING) AS cum, SUM(c) OVER () AS n FROM (${histogram}) AS h
    ) AS w`
}

/**
 * The sale-price quartiles and the median days to sell of all the items sold in the period (the totals row), each
 * as four times the figure, from a histogram of each (see histogramQuartilesSql); no row when nothing sold.
 */
export function reportSoldTotalsSql(input: ReportSqlInput): SQL {
  const { fromDay, toDay } = periodBounds(input.filters)
  const from = fromWhere(input, false, [sql`i.status IN ${SOLD}`, inPeriod(sql.raw('i.sold_on'), fromDay, toDay)])
  const prices = histogramQuartilesSql(sql`SELECT i.sale_price_cents AS v, COUNT(*) AS c ${from} GROUP BY v`, [1, 2, 3])
  const days = histogramQuartilesSql(sql`SELECT DATEDIFF(i.sold_on, i.acquired_on) AS v, COUNT(*) AS c ${from} GROUP BY v`, [2])
  return sql`${withClause(input, false)}SELECT 0 AS g, p.n AS n, p.x1 AS q1x4, p.x2 AS q2x4, p.x3 AS q3x4, d.x2 AS d2x4
    FROM (${prices}) AS p CROSS JOIN (${days}) AS d WHERE p.n > 0`
}

/**
 * The month report's counts, one row per month of the series: bought, listed and sold in the month, the stock
 * on hand at its start (the stock on the first day shown, plus running sums of what came and what left),
 * revenue, net, the cost of what sold, and the unsold stock at its end with the sum of its ages counted to the
 * month's last day (or to `ageDay` for the month still running). Each stream is grouped by its raw date first,
 * which the covering indexes deliver in order, then by month over those few rows.
 */
export function reportMonthCountsSql(input: ReportSqlInput, range: ReportMonthRange): SQL {
  const live = sql`i.status NOT IN ${GONE}`
  const first = range.first
  const stream = (index: ReportIndex, column: string) => fromWhere(input, false, [sql`${sql.raw(column)} >= ${first}`], index)
  const ym = (column: string) => sql.raw(`DATE_FORMAT(${column}, '%Y-%m')`)
  const zeros = (n: number) => sql.raw(Array.from({ length: n }, () => '0').join(', '))
  // Columns of every stream: bought, live_in, live_in_cost, live_in_days, listed, sold, revenue, net, sold_cost, gone, gone_cost, gone_days.
  const acquired = sql`SELECT ${ym('d')} AS m, SUM(n), SUM(live_n), SUM(live_cost), SUM(live_days), ${zeros(8)} FROM (
      SELECT i.acquired_on AS d, COUNT(*) AS n, SUM(${live}) AS live_n, SUM(IF(${live}, i.cost_cents, 0)) AS live_cost,
        SUM(IF(${live}, TO_DAYS(i.acquired_on), 0)) AS live_days
      ${stream('items_report_acquired_idx', 'i.acquired_on')} GROUP BY i.acquired_on) AS a GROUP BY m`
  const listed = sql`SELECT ${ym('d')} AS m, ${zeros(4)}, SUM(n), ${zeros(7)} FROM (
      SELECT i.listed_on AS d, COUNT(*) AS n ${stream('items_report_listed_idx', 'i.listed_on')} GROUP BY i.listed_on) AS l GROUP BY m`
  const soldStream = sql`SELECT ${ym('d')} AS m, ${zeros(5)}, SUM(sold_n), SUM(revenue), SUM(net), SUM(sold_cost), SUM(gone_n), SUM(gone_cost), SUM(gone_days) FROM (
      SELECT i.sold_on AS d, SUM(i.status IN ${SOLD}) AS sold_n,
        SUM(IF(i.status IN ${SOLD}, i.sale_price_cents + COALESCE(i.shipping_charged_cents, 0), 0)) AS revenue,
        SUM(IF(i.status IN ${SOLD}, i.net_profit_cents, 0)) AS net, SUM(IF(i.status IN ${SOLD}, i.cost_cents, 0)) AS sold_cost,
        SUM(${live}) AS gone_n, SUM(IF(${live}, i.cost_cents, 0)) AS gone_cost, SUM(IF(${live}, TO_DAYS(i.acquired_on), 0)) AS gone_days
      ${stream('items_report_sold_idx', 'i.sold_on')} GROUP BY i.sold_on) AS s GROUP BY m`
  // The stock on hand on the first day shown: acquired before it and not gone before it.
  const opening = sql`SELECT COUNT(*) AS stock, COALESCE(SUM(i.cost_cents), 0) AS stock_cost, COALESCE(SUM(TO_DAYS(i.acquired_on)), 0) AS stock_days
      ${fromWhere(input, false, [sql`i.acquired_on < ${first}`, sql`(i.sold_on IS NULL OR i.sold_on >= ${first})`, live], 'items_report_sold_idx')}`
  return sql`${withClause(input, false)}${input.filters.categoryId ? sql`, ` : sql`WITH RECURSIVE `}months (m) AS (
      SELECT CAST(${first} AS DATE) UNION ALL SELECT m + INTERVAL 1 MONTH FROM months WHERE m < CAST(${range.last} AS DATE)
    ),
    ev (m, bought, live_in, live_in_cost, live_in_days, listed, sold, revenue, net, sold_cost, gone, gone_cost, gone_days) AS (
      ${acquired} UNION ALL ${listed} UNION ALL ${soldStream}
    ),
    per AS (SELECT m, SUM(bought) AS bought, SUM(live_in - gone) AS stock, SUM(live_in_cost - gone_cost) AS stock_cost,
      SUM(live_in_days - gone_days) AS stock_days, SUM(listed) AS listed, SUM(sold) AS sold, SUM(revenue) AS revenue, SUM(net) AS net,
      SUM(sold_cost) AS sold_cost FROM ev GROUP BY m),
    opening AS (${opening}),
    run AS (
      SELECT s.m, s.end_day, COALESCE(p.bought, 0) AS bought, COALESCE(p.listed, 0) AS listed, COALESCE(p.sold, 0) AS sold,
        COALESCE(p.revenue, 0) AS revenue, COALESCE(p.net, 0) AS net, COALESCE(p.sold_cost, 0) AS sold_cost,
        COALESCE(p.stock, 0) AS stock_change,
        SUM(COALESCE(p.stock, 0)) OVER (ORDER BY s.m) AS stock_cum,
        SUM(COALESCE(p.stock_cost, 0)) OVER (ORDER BY s.m) AS cost_cum,
        SUM(COALESCE(p.stock_days, 0)) OVER (ORDER BY s.m) AS days_cum
      FROM (SELECT DATE_FORMAT(m, '%Y-%m') AS m, LEAST(LAST_DAY(m), CAST(${input.ageDay} AS DATE)) AS end_day FROM months) AS s
      LEFT JOIN per p ON p.m = s.m
    )
    SELECT run.m AS g, bought, listed, sold, revenue, net, sold_cost,
      o.stock + stock_cum - stock_change AS on_start,
      o.stock + stock_cum AS unsold,
      o.stock_cost + cost_cum AS unsold_cost,
      (o.stock + stock_cum) * TO_DAYS(end_day) - (o.stock_days + days_cum) AS unsold_age_days
    FROM run CROSS JOIN opening o ORDER BY run.m`
}

/** The first month with an item acquired, for a month report without a start date. */
export function reportFirstMonthSql(input: ReportSqlInput): SQL {
  return sql`${withClause(input, false)}SELECT DATE_FORMAT(MIN(i.acquired_on), '%Y-%m-01') AS first ${fromWhere(input, false)}`
}

/** Names of the groups a report found (labels are read after the figures, for the few ids that came back). */
export function reportLabelsSql(teamId: number, dimension: Exclude<ReportDimension, 'month'>, ids: number[]): SQL | null {
  if (!ids.length) return null
  const list = sql.join(ids.map(id => sql`${id}`), sql`, `)
  switch (dimension) {
    case 'category': return sql`SELECT id, name AS label, deleted_at IS NOT NULL AS deleted FROM categories WHERE team_id = ${teamId} AND id IN (${list})`
    case 'mark': return sql`SELECT id, title AS label, deleted_at IS NOT NULL AS deleted FROM marks WHERE team_id = ${teamId} AND id IN (${list})`
    case 'maker': return sql`SELECT id, name AS label, deleted_at IS NOT NULL AS deleted FROM makers WHERE team_id = ${teamId} AND id IN (${list})`
    case 'material': return sql`SELECT id, name AS label, deleted_at IS NOT NULL AS deleted FROM materials WHERE team_id = ${teamId} AND id IN (${list})`
    case 'store': return sql`SELECT id, name AS label, FALSE AS deleted FROM stores WHERE team_id = ${teamId} AND id IN (${list})`
    // Someone who left the team keeps their name on what they sourced; the membership says whether they left.
    case 'member': return sql`SELECT u.id, u.name AS label, m.id IS NULL AS deleted FROM users u
      LEFT JOIN memberships m ON m.team_id = ${teamId} AND m.user_id = u.id WHERE u.id IN (${list})`
  }
}

/** An entry's most recent items (by sale date, else acquisition date), for its outcomes panel. */
export function reportRecentItemsSql(input: ReportSqlInput, limit: number): SQL {
  return sql`${withClause(input, false)}SELECT i.id, i.title, i.status, i.acquired_on, i.sold_on, i.cost_cents, i.sale_price_cents,
    i.net_profit_cents ${fromWhere(input, false)} ORDER BY COALESCE(i.sold_on, i.acquired_on) DESC, i.id DESC LIMIT ${limit}`
}

// ---- Buy check: the team's comparable sales of a mark, a maker or categories (with their subcategories).

export type BuyCheckLevel = 'mark' | 'maker' | 'category'

/** The buy check prices from a level's latest sales only: the recent market, and a bounded amount of work. */
export const BUY_CHECK_LATEST_SALES = 500

const BOXED = sql.raw('(i.box_length_mm IS NOT NULL AND i.box_width_mm IS NOT NULL AND i.box_height_mm IS NOT NULL)')

function categorySubtree(teamId: number, categoryIds: number[]): SQL {
  return sql`WITH RECURSIVE ${categorySubtreeCte(teamId, categoryIds)} `
}

function comparableWhere(teamId: number, level: BuyCheckLevel, id: number | null): SQL {
  const byLevel = level === 'mark' ? sql`i.mark_id = ${id}` : level === 'maker' ? sql`i.maker_id = ${id}` : sql`i.category_id IN (SELECT id FROM cat_filter)`
  return sql`i.team_id = ${teamId} AND ${byLevel} AND i.status IN ${SOLD}`
}

/** How many comparable sales each level has. */
export function buyCheckLevelCountsSql(teamId: number, markId: number | null, makerId: number | null, categoryIds: number[]): SQL {
  const count = (level: BuyCheckLevel, id: number | null) => sql`(SELECT COUNT(*) FROM items i WHERE ${comparableWhere(teamId, level, id)})`
  return sql`${categoryIds.length ? categorySubtree(teamId, categoryIds) : sql``}SELECT
    ${markId ? count('mark', markId) : sql`0`} AS mark_n,
    ${makerId ? count('maker', makerId) : sql`0`} AS maker_n,
    ${categoryIds.length ? count('category', null) : sql`0`} AS category_n`
}

/**
 * The spread of the sale price per piece (sale price ÷ quantity, rounded half-up to the cent) of a level's latest
 * BUY_CHECK_LATEST_SALES sales,
 * the median days to sell, the median weight and box sides of those that have them, and the sums of shipping
 * charged and supplies, each quartile as four times its value. The latest sales are picked from a covering index
 * first (ids only), so only those rows are read whole. NULLs sort first, so the rank of a weight among
 * those present is its rank less the count of NULLs. (Numbering the present ones in a window PARTITION BY
 * "weight IS NULL" instead made MariaDB 10.11 number the other windows of the same SELECT wrongly.)
 */
export function buyCheckStatsSql(teamId: number, level: BuyCheckLevel, id: number | null, categoryIds: number[], condition: string | null): SQL {
  const where = condition ? sql`${comparableWhere(teamId, level, id)} AND i.condition_grade = ${condition}` : comparableWhere(teamId, level, id)
  return sql`${level === 'category' ? categorySubtree(teamId, categoryIds) : sql``}SELECT MAX(n) AS n, MAX(nw) AS nw, MAX(nb) AS nb,
    ${quartileTimesFour('piece', 'rp', 'n', 1)} AS q1x4,
    ${quartileTimesFour('piece', 'rp', 'n', 2)} AS q2x4,
    ${quartileTimesFour('piece', 'rp', 'n', 3)} AS q3x4,
    ${quartileTimesFour('days', 'rd', 'n', 2)} AS d2x4,
    ${quartileTimesFour('weight', 'rw - (n - nw)', 'nw', 2, 'weight IS NOT NULL')} AS w2x4,
    ${quartileTimesFour('bl', 'rl - (n - nb)', 'nb', 2, 'bl IS NOT NULL')} AS l2x4,
    ${quartileTimesFour('bw', 'rwd - (n - nb)', 'nb', 2, 'bl IS NOT NULL')} AS bw2x4,
    ${quartileTimesFour('bh', 'rh - (n - nb)', 'nb', 2, 'bl IS NOT NULL')} AS h2x4,
    SUM(shipping) AS shipping, SUM(supplies) AS supplies
    FROM (
      SELECT piece, days, weight, bl, bw, bh, shipping, supplies,
        ROW_NUMBER() OVER (ORDER BY piece) AS rp,
        ROW_NUMBER() OVER (ORDER BY days) AS rd,
        COUNT(*) OVER () AS n,
        ROW_NUMBER() OVER (ORDER BY weight) AS rw,
        COUNT(weight) OVER () AS nw,
        ROW_NUMBER() OVER (ORDER BY bl) AS rl,
        ROW_NUMBER() OVER (ORDER BY bw) AS rwd,
        ROW_NUMBER() OVER (ORDER BY bh) AS rh,
        COUNT(bl) OVER () AS nb
      FROM (SELECT (2 * i.sale_price_cents + i.quantity) DIV (2 * i.quantity) AS piece, DATEDIFF(i.sold_on, i.acquired_on) AS days,
          i.weight_grams AS weight,
          IF(${BOXED}, i.box_length_mm, NULL) AS bl, IF(${BOXED}, i.box_width_mm, NULL) AS bw, IF(${BOXED}, i.box_height_mm, NULL) AS bh,
          COALESCE(i.shipping_charged_cents, 0) AS shipping, COALESCE(i.supplies_cents, 0) AS supplies
        FROM (SELECT i.id FROM items i WHERE ${where} ORDER BY i.sold_on DESC, i.id DESC LIMIT ${BUY_CHECK_LATEST_SALES}) AS latest
        JOIN items i ON i.id = latest.id) AS x
    ) AS s`
}
