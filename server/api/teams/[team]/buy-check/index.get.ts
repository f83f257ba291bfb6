// Should I buy this: the expected sale from the team's comparable sales (mark, else maker, else category),
// fees, postage, net, ROI, the most to pay and a verdict against the owner's targets, with the cautions.
import { buyCheckQuery } from '../../../../../shared/schemas/reports'

export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'viewer')
  const query = validQuery(event, buyCheckQuery)
  return await buyCheckRun(access, query)
})
