// The buy-price arithmetic: fees, postage estimate, break-even, max buy price, net and ROI at a price. Writes nothing.
import { calculatorSchema } from '../../../../../shared/schemas/ledger'

export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'viewer')
  const input = await validBody(event, calculatorSchema)
  return await ledgerCalculate(access, input)
})
