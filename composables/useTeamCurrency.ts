// The currency every amount on screen is shown in: the team's (its ledger settings, sent with the person's
// teams by /api/me). Kept in Nuxt state, so each server render has its own and the browser takes it over.
import { DEFAULT_LEDGER_CURRENCY } from '~~/shared/ledger/currencies'

const CURRENCY_STATE = 'tallymark-currency'

/** The currency of the team on screen; read while rendering, so figures follow a change of team or setting. */
export function ledgerCurrency(): string {
  if (!tryUseNuxtApp()) return DEFAULT_LEDGER_CURRENCY
  return useState<string>(CURRENCY_STATE, () => DEFAULT_LEDGER_CURRENCY).value
}

/** Follows the team in the route (the default layout calls it once). */
export function useTeamCurrency() {
  const { team } = useTeam()
  const state = useState<string>(CURRENCY_STATE, () => DEFAULT_LEDGER_CURRENCY)
  const apply = () => { state.value = team.value?.currency ?? DEFAULT_LEDGER_CURRENCY }
  apply()
  watch(() => team.value?.currency, apply)
  return readonly(state)
}
