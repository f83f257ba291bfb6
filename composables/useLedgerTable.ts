// The ledger lists' TanStack table, headless: sorting and paging are the server's (manual), the state comes
// from the page's URL through the list component's props, and a header click hands the new `sort` back.
import { createColumnHelper, rowPaginationFeature, rowSortingFeature, tableFeatures, useTable } from '@tanstack/vue-table'
import type { ColumnDef, PaginationState, SortingState } from '@tanstack/vue-table'

const features = tableFeatures({ rowSortingFeature, rowPaginationFeature })
export type LedgerTableFeatures = typeof features

export function ledgerColumnHelper<TData extends { id: number }>() {
  return createColumnHelper<LedgerTableFeatures, TData>()
}

/** The colour of a gain or a loss (ledgerTone) in a row or on a card; none for nothing or zero. */
export function ledgerToneClass(tone: 'gain' | 'loss' | undefined): string {
  return tone === 'gain' ? 'text-moss-700' : tone === 'loss' ? 'text-clay-700' : ''
}

/** The page of the server's list the table shows (the list component's props). */
export interface LedgerTablePage { total: number, page: number, pageSize: number, sort: string | undefined }

export function useLedgerTable<TData extends { id: number }>(options: {
  columns: ColumnDef<LedgerTableFeatures, TData, any>[]
  data: () => TData[]
  page: LedgerTablePage
  /** False where the rows are not the server's sorted list. */
  sortable?: boolean
  onSort: (sort: string | undefined) => void
}) {
  const { page } = options
  const sorting = computed<SortingState>(() => ledgerSortState(page.sort))
  const pagination = computed<PaginationState>(() => ({ pageIndex: page.page - 1, pageSize: page.pageSize }))
  return useTable({
    features,
    columns: options.columns,
    data: computed(() => options.data()),
    state: computed(() => ({ sorting: sorting.value, pagination: pagination.value })),
    manualSorting: true,
    manualPagination: true,
    rowCount: computed(() => page.total),
    enableSorting: options.sortable ?? true,
    enableMultiSort: false,
    enableSortingRemoval: false,
    onSortingChange: (next) => {
      const value = typeof next === 'function' ? next(sorting.value) : next
      options.onSort(ledgerSortParam(value))
    },
    getRowId: (row: TData) => String(row.id),
  })
}
