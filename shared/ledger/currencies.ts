// The currencies a team can keep its ledger in: ISO 4217 codes whose minor unit is two decimals, because the
// ledger stores every amount in hundredths (integer cents). Source of the codes and minor units: ISO 4217,
// list one (current currencies, column "minor unit"). Currencies with no decimals (JPY, KRW) or three (KWD)
// would have their amounts misread, so they are not offered.
export const LEDGER_CURRENCIES = [
  'USD', 'CAD', 'EUR', 'GBP', 'AUD', 'NZD', 'CHF', 'SEK', 'NOK', 'DKK', 'PLN', 'MXN', 'BRL', 'ZAR', 'SGD', 'HKD', 'INR',
] as const
export type LedgerCurrency = typeof LEDGER_CURRENCIES[number]

export const DEFAULT_LEDGER_CURRENCY: LedgerCurrency = 'USD'

/** The name of a currency in English, for the settings list ("EUR — Euro"). */
export function currencyName(code: string): string {
  try {
    return new Intl.DisplayNames(['en'], { type: 'currency' }).of(code) ?? code
  }
  catch {
    return code
  }
}

/** A code as stored (anything outside the list, e.g. an old row, reads as the default). */
export function ledgerCurrencyOf(code: string | null | undefined): LedgerCurrency {
  return (LEDGER_CURRENCIES as readonly string[]).includes(code ?? '') ? code as LedgerCurrency : DEFAULT_LEDGER_CURRENCY
}
