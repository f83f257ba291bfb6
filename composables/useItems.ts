// Ledger items from the API (useFetch: the server owns them; nothing is copied into a store).
import type { MaybeRefOrGetter } from 'vue'
import type { ListingDraft } from '~~/shared/ledger/listing-draft'
import type { EntryPhoto } from '~~/shared/photos'
import type { LedgerItem, LedgerItemDetail, LedgerItemTotals, LedgerPage, LedgerStatusEvent } from '~~/shared/types/ledger'

export type LedgerItemList = LedgerPage<LedgerItem> & { totals: LedgerItemTotals }

/** One page of items for filters, sort and page (the item list's query), with totals over every matching row. */
export function useItems(query: MaybeRefOrGetter<Record<string, string | number | undefined>>, options: { key?: string, lazy?: boolean } = {}) {
  const { slug } = useTeam()
  return useFetch<LedgerItemList>(() => `/api/teams/${slug.value}/items`, {
    query: computed(() => toValue(query)),
    key: options.key,
    lazy: options.lazy,
    default: () => ({ items: [], total: 0, page: 1, pageSize: 25, totals: { items: 0, costCents: 0, revenueCents: 0, netProfitCents: 0 } }),
  })
}

export function useItem(id: MaybeRefOrGetter<number>) {
  const { slug } = useTeam()
  return useFetch<LedgerItemDetail>(() => `/api/teams/${slug.value}/items/${toValue(id)}`, { key: `ledger-item-${toValue(id)}` })
}

export function useItemStatusHistory(id: MaybeRefOrGetter<number>) {
  const { slug } = useTeam()
  return useFetch<{ items: LedgerStatusEvent[] }>(() => `/api/teams/${slug.value}/items/${toValue(id)}/status`, {
    key: `ledger-item-status-${toValue(id)}`,
    default: () => ({ items: [] }),
  })
}

/** The listing text the server assembles from the reference; fetched when asked for. */
export function useListingDraft(id: MaybeRefOrGetter<number>) {
  const { slug } = useTeam()
  return useFetch<ListingDraft>(() => `/api/teams/${slug.value}/items/${toValue(id)}/listing-draft`, {
    key: `ledger-item-draft-${toValue(id)}`,
    immediate: false,
    server: false,
  })
}

/** The filters of the item list that the CSV export also takes (no page, size or sort). */
export const LEDGER_ITEM_FILTER_KEYS = [
  'status', 'categoryId', 'subcategories', 'markId', 'makerId', 'materialId', 'storeId', 'tripId', 'sourcedBy',
  'acquiredFrom', 'acquiredTo', 'soldFrom', 'soldTo', 'q',
] as const

/**
 * A photo for an item, sent now or kept on the phone with no signal (useOfflineQueue): for an item the
 * server has (`itemId`), or for one still in the queue (`dependsOn`, its queued change), uploaded after it.
 */
export async function ledgerSendItemPhoto(slug: string, target: { itemId: number } | { dependsOn: number }, file: File, itemTitle: string) {
  return await offlineSendOrQueue<EntryPhoto>({
    method: 'POST', url: `/api/teams/${slug}/uploads`,
    body: { entityType: 'item', entityId: 'itemId' in target ? target.itemId : null },
    file, fileName: file.name || 'photo.jpg',
    dependsOn: 'dependsOn' in target ? target.dependsOn : undefined,
    label: `Photo of “${itemTitle}”`,
    pagePath: 'itemId' in target ? `/t/${slug}/items/${target.itemId}` : `/t/${slug}/offline`,
  })
}

/** Uploads a photo and attaches it to the item (the item must exist first). */
export async function ledgerUploadItemPhoto(slug: string, itemId: number, file: File) {
  const form = new FormData()
  form.append('file', file, file.name || 'photo.jpg')
  form.append('entityType', 'item')
  form.append('entityId', String(itemId))
  return await apiFetch<EntryPhoto>(`/api/teams/${slug}/uploads`, { method: 'POST', body: form })
}

/** The sale route's answer: the sold item and the timeline notes written with it. */
export interface LedgerSaleResult { item: LedgerItem, notes: { entryType: 'mark' | 'category', entryId: number, noteId: number }[] }
