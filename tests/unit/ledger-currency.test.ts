// The team's currency: which ISO 4217 codes a team may pick (those with two decimals, as the ledger keeps
// hundredths), the settings schema, and money formatted in it where no currency is named.
// Minor units checked against ISO 4217 list one (current currency codes, column "minor unit"): 2 for every
// code offered, 0 for JPY and KRW, 3 for KWD and BHD.
import { afterEach, describe, expect, it } from 'vitest'
import { DEFAULT_LEDGER_CURRENCY, LEDGER_CURRENCIES, currencyName, ledgerCurrencyOf } from '../../shared/ledger/currencies'
import { displayCurrencyCode, formatCents, parseMoney, setDisplayCurrencySource } from '../../shared/ledger/money'
import { reportMoney, reportMoneyShort, reportSpread } from '../../shared/reports/format'
import { ledgerSettingsPatchSchema } from '../../shared/schemas/ledger'

afterEach(() => setDisplayCurrencySource(() => 'USD'))

describe('the currencies a team can pick', () => {
  it('are ISO 4217 codes with two decimals, USD first and the default', () => {
    expect(DEFAULT_LEDGER_CURRENCY).toBe('USD')
    expect(LEDGER_CURRENCIES[0]).toBe('USD')
    for (const code of LEDGER_CURRENCIES) {
      expect(code).toMatch(/^[A-Z]{3}$/)
      expect(new Intl.NumberFormat('en-US', { style: 'currency', currency: code }).resolvedOptions().maximumFractionDigits, code).toBe(2)
      // Every one formats and reads back to the same cents.
      expect(parseMoney(formatCents(123456, code))).toEqual({ ok: true, cents: 123456 })
      expect(currencyName(code)).not.toBe(code)
    }
    for (const code of ['JPY', 'KRW', 'KWD', 'BHD']) expect(LEDGER_CURRENCIES as readonly string[]).not.toContain(code)
    expect(new Set(LEDGER_CURRENCIES).size).toBe(LEDGER_CURRENCIES.length)
  })

  it('are validated by the settings schema, which takes lower case and refuses the rest', () => {
    expect(ledgerSettingsPatchSchema.parse({ currency: ' eur ' })).toEqual({ currency: 'EUR' })
    expect(ledgerSettingsPatchSchema.parse({})).toEqual({})
    for (const bad of ['JPY', 'EURO', '€', '', 'XTS']) expect(ledgerSettingsPatchSchema.safeParse({ currency: bad }).success, bad).toBe(false)
  })

  it('read an unknown stored code as the default', () => {
    expect(ledgerCurrencyOf('GBP')).toBe('GBP')
    expect(ledgerCurrencyOf('JPY')).toBe('USD')
    expect(ledgerCurrencyOf(null)).toBe('USD')
  })
})

describe('money without a named currency', () => {
  it('is formatted in the display currency the app points at (the team\'s)', () => {
    expect(formatCents(1250)).toBe('$12.50')
    setDisplayCurrencySource(() => 'EUR')
    expect(displayCurrencyCode()).toBe('EUR')
    expect(formatCents(1250)).toBe('€12.50')
    expect(reportMoney(-705)).toBe('-€7.05')
    expect(reportSpread(800, 1450)).toBe('€8.00–€14.50')
    expect(reportMoneyShort(123_456)).toBe('€1,235')
    expect(reportMoneyShort(-249)).toBe('−€2')
    expect(reportMoneyShort(-40)).toBe('€0')
    setDisplayCurrencySource(() => 'CHF')
    expect(formatCents(1250)).toMatch(/^CHF\s12\.50$/)
    // A named currency always wins.
    expect(formatCents(1250, 'GBP')).toBe('£12.50')
    expect(reportMoney(1250, 'USD')).toBe('$12.50')
  })
})
