// Sourcing trips from the API, with the figures the server computes as their items sell.
import type { MaybeRefOrGetter } from 'vue'
import type { LedgerPage, LedgerStore, LedgerTrip, LedgerTripTotals, StoreKind } from '~~/shared/types/ledger'

export type LedgerTripList = LedgerPage<LedgerTrip> & { totals: LedgerTripTotals }

export function useTrips(query: MaybeRefOrGetter<Record<string, string | number | undefined>>, options: { key?: string } = {}) {
  const { slug } = useTeam()
  return useFetch<LedgerTripList>(() => `/api/teams/${slug.value}/trips`, {
    query: computed(() => toValue(query)),
    key: options.key,
    default: () => ({ items: [], total: 0, page: 1, pageSize: 25, totals: { trips: 0, totalSpentCents: 0, revenueCents: 0, netSoFarCents: 0 } }),
  })
}

export function useTrip(id: MaybeRefOrGetter<number | null>) {
  const { slug } = useTeam()
  return useFetch<LedgerTrip>(() => `/api/teams/${slug.value}/trips/${toValue(id)}`, {
    key: `ledger-trip-${toValue(id)}`,
    immediate: toValue(id) !== null,
  })
}

/** What the trip starter asks for: a trip at a known store, or at a store to add first. */
export type LedgerTripStart = { storeId: number } | { newStore: { name: string, kind: StoreKind } }

/**
 * Starts today's trip (adding the store first when it is new) and makes it this device's current trip.
 * Returns the trip, or throws the API problem.
 */
export async function ledgerStartTrip(slug: string, start: LedgerTripStart, tripDate: string) {
  let storeId: number
  if ('newStore' in start) {
    const store = await apiFetch<LedgerStore>(`/api/teams/${slug}/stores`, { method: 'POST', body: start.newStore })
    storeId = store.id
    await refreshNuxtData(`ledger-stores-${slug}`)
  }
  else storeId = start.storeId
  const trip = await apiFetch<LedgerTrip>(`/api/teams/${slug}/trips`, { method: 'POST', body: { storeId, tripDate } })
  useCurrentTripStore().startTrip(slug, { tripId: trip.id, storeId: trip.storeId, storeName: trip.storeName, tripDate: trip.tripDate })
  return trip
}
