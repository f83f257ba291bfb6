// The sourcing trip this device is on, per team: real client state (the server does not know which trip a
// phone is adding to). Kept in a cookie so the quick-add page renders with it on the server too; the last
// category used rides along, because a shelf of one kind of goods is added piece after piece.
import { defineStore } from 'pinia'

export interface CurrentTrip {
  tripId: number
  storeId: number
  storeName: string
  /** The trip's calendar day, yyyy-mm-dd. */
  tripDate: string
}

export interface QuickAddPicks {
  categoryId: number | null
  categoryName: string
  condition: string | null
}

const YEAR = 60 * 60 * 24 * 365

export const useCurrentTripStore = defineStore('currentTrip', () => {
  const trips = useCookie<Record<string, CurrentTrip>>('tm-current-trip', { default: () => ({}), sameSite: 'lax', maxAge: YEAR })
  const picks = useCookie<Record<string, QuickAddPicks>>('tm-quick-picks', { default: () => ({}), sameSite: 'lax', maxAge: YEAR })

  function tripOf(team: string): CurrentTrip | null {
    return trips.value?.[team] ?? null
  }
  function startTrip(team: string, trip: CurrentTrip) {
    trips.value = { ...trips.value, [team]: { tripId: trip.tripId, storeId: trip.storeId, storeName: trip.storeName, tripDate: trip.tripDate } }
  }
  function endTrip(team: string, tripId?: number) {
    const current = trips.value?.[team]
    if (!current || (tripId !== undefined && current.tripId !== tripId)) return
    trips.value = Object.fromEntries(Object.entries(trips.value ?? {}).filter(([slug]) => slug !== team))
  }
  function picksOf(team: string): QuickAddPicks {
    return picks.value?.[team] ?? { categoryId: null, categoryName: '', condition: null }
  }
  function rememberPicks(team: string, next: QuickAddPicks) {
    picks.value = { ...picks.value, [team]: { categoryId: next.categoryId, categoryName: next.categoryName.slice(0, 80), condition: next.condition } }
  }
  return { trips, picks, tripOf, startTrip, endTrip, picksOf, rememberPicks }
})
