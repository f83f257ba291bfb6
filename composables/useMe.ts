import type { Role } from '~~/shared/roles'
import type { LedgerCurrency } from '~~/shared/ledger/currencies'

export interface MeResponse {
  user: { id: number, email: string, name: string }
  teams: { slug: string, name: string, role: Role, timeZone: string, currency: LedgerCurrency }[]
}

/** The signed-in person and their teams; shared by every page through one keyed fetch. */
export function useMe() {
  const { loggedIn } = useUserSession()
  const result = useFetch<MeResponse>('/api/me', {
    key: 'me',
    immediate: loggedIn.value,
    watch: [loggedIn],
    default: () => null as unknown as MeResponse,
  })
  return result
}

/**
 * Refetches the person and their teams now. refreshNuxtData first waits for the browser to be idle
 * (onNuxtReady → requestIdleCallback), which on a busy phone can hold a sign-in for seconds.
 */
export async function refreshMe() {
  await useNuxtApp().hooks.callHookParallel('app:data:refresh', ['me'])
}
