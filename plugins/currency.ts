// Money formatted without a named currency (shared/ledger/money.ts formatCents, the reports' and the ledger's
// helpers) takes the team's: the source is read at each call, inside this render's own Nuxt app.
import { setDisplayCurrencySource } from '~~/shared/ledger/money'

export default defineNuxtPlugin(() => {
  setDisplayCurrencySource(ledgerCurrency)
})
