// The item edit form as strings (what its inputs hold) and back to a PATCH body: money read with
// shared/ledger parseMoney, only the fields that changed, errors keyed by the form's field.
import type { LedgerItem, LedgerItemPatchInput } from '~~/shared/types/ledger'
import type { LedgerFormValues } from './useLedgerMerge'

export const LEDGER_ITEM_LABELS: Record<string, string> = {
  title: 'Title', categoryId: 'Category', markId: 'Mark', makerId: 'Maker', materialId: 'Material', quantity: 'Pieces',
  condition: 'Condition', damageFlags: 'Damage', damageNotes: 'Damage notes', weightGrams: 'Weight (grams)',
  boxL: 'Box length (mm)', boxW: 'Box width (mm)', boxH: 'Box height (mm)', cost: 'Cost', acquiredOn: 'Bought on',
  asking: 'Asking price', listedOn: 'Listed on', feeProfileId: 'Channel', soldOn: 'Sold on', shippedOn: 'Shipped on',
  salePrice: 'Sale price', shippingCharged: 'Shipping charged', postage: 'Postage', supplies: 'Supplies', fees: 'Fees',
  refund: 'Refund', externalId: 'External id', notes: 'Notes',
}

export const LEDGER_ITEM_MONEY_FIELDS = new Set(['cost', 'asking', 'salePrice', 'shippingCharged', 'postage', 'supplies', 'fees', 'refund'])

/** Form field → the API field its errors come back under. */
export const LEDGER_ITEM_SERVER_FIELD: Record<string, string> = {
  cost: 'costCents', asking: 'askingCents', salePrice: 'salePriceCents', shippingCharged: 'shippingChargedCents', postage: 'postageCents',
  supplies: 'suppliesCents', fees: 'feesCents', refund: 'refundCents', damageFlags: 'damage.flags', damageNotes: 'damage.notes',
  boxL: 'box', boxW: 'box', boxH: 'box',
}

const idText = (id: number | null) => (id === null ? '' : String(id))
const numberText = (n: number | null) => (n === null ? '' : String(n))

export function ledgerItemForm(item: LedgerItem): LedgerFormValues {
  return {
    title: item.title,
    categoryId: idText(item.categoryId), markId: idText(item.markId), makerId: idText(item.makerId), materialId: idText(item.materialId),
    quantity: String(item.quantity), condition: item.condition ?? '',
    damageFlags: item.damage.flags.join(','), damageNotes: item.damage.notes,
    weightGrams: numberText(item.weightGrams),
    boxL: numberText(item.box?.lengthMm ?? null), boxW: numberText(item.box?.widthMm ?? null), boxH: numberText(item.box?.heightMm ?? null),
    cost: ledgerCentsText(item.costCents), acquiredOn: item.acquiredOn,
    asking: ledgerCentsText(item.askingCents), listedOn: item.listedOn ?? '', feeProfileId: idText(item.feeProfileId),
    soldOn: item.soldOn ?? '', shippedOn: item.shippedOn ?? '',
    salePrice: ledgerCentsText(item.salePriceCents), shippingCharged: ledgerCentsText(item.shippingChargedCents),
    postage: ledgerCentsText(item.postageCents), supplies: ledgerCentsText(item.suppliesCents),
    // Fees the channel's profile computed are shown empty: left empty, they stay computed.
    fees: item.feesManual ? ledgerCentsText(item.feesCents) : '',
    refund: ledgerCentsText(item.refundCents),
    externalId: item.externalId ?? '', notes: item.notes,
  }
}

const MONEY_TARGET: Record<string, keyof LedgerItemPatchInput> = {
  cost: 'costCents', asking: 'askingCents', salePrice: 'salePriceCents', shippingCharged: 'shippingChargedCents',
  postage: 'postageCents', supplies: 'suppliesCents', fees: 'feesCents', refund: 'refundCents',
}

export function ledgerItemPatch(form: LedgerFormValues, changed: string[]): { body: Partial<LedgerItemPatchInput>, errors: Record<string, string> } {
  const body: Record<string, unknown> = {}
  const errors: Record<string, string> = {}
  const whole = (key: string, min: number): number | null | undefined => {
    const text = (form[key] ?? '').trim()
    if (!text) return null
    const n = Number(text)
    if (!Number.isSafeInteger(n) || n < min) {
      errors[key] = `Enter a whole number of at least ${min}.`
      return undefined
    }
    return n
  }
  for (const key of changed) {
    const text = (form[key] ?? '').trim()
    if (LEDGER_ITEM_MONEY_FIELDS.has(key)) {
      const read = ledgerReadCents(text)
      if (!read.ok) errors[key] = read.error
      else body[MONEY_TARGET[key]!] = key === 'cost' ? read.cents ?? 0 : read.cents
    }
    else if (['categoryId', 'markId', 'makerId', 'materialId', 'feeProfileId'].includes(key)) body[key] = text ? Number(text) : null
    else if (key === 'quantity') {
      const n = whole('quantity', 1)
      if (n === null) errors.quantity = 'A lot or set counts at least 1 piece.'
      else if (n !== undefined) body.quantity = n
    }
    else if (key === 'weightGrams') {
      const n = whole('weightGrams', 0)
      if (n !== undefined) body.weightGrams = n
    }
    else if (key === 'damageFlags' || key === 'damageNotes') {
      body.damage = { flags: (form.damageFlags ?? '').split(',').filter(Boolean), notes: (form.damageNotes ?? '').trim() }
    }
    else if (key === 'boxL' || key === 'boxW' || key === 'boxH') {
      const sides = (['boxL', 'boxW', 'boxH'] as const).map(k => (form[k] ?? '').trim())
      if (sides.every(s => !s)) body.box = null
      else if (sides.some(s => !s)) errors.box = 'Give all three sides of the box, or none.'
      else {
        const [length, width, height] = sides.map(Number) as [number, number, number]
        if ([length, width, height].some(n => !Number.isFinite(n) || n <= 0)) errors.box = 'Box sides are positive numbers of millimetres.'
        else body.box = { length, width, height, unit: 'mm' }
      }
    }
    else if (['listedOn', 'soldOn', 'shippedOn'].includes(key)) body[key] = text || null
    else if (key === 'condition' || key === 'externalId') body[key] = text || null
    else if (key === 'acquiredOn') {
      if (!text) errors.acquiredOn = 'Enter the day it was bought.'
      else body.acquiredOn = text
    }
    else if (key === 'title') {
      if (!text) errors.title = 'Give the item a title.'
      else body.title = text
    }
    else body[key] = text
  }
  return { body: body as Partial<LedgerItemPatchInput>, errors }
}
