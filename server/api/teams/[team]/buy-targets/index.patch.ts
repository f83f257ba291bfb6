// Sets the team's buy targets (owners only), with the revision the change is based on (0 before the first save).
import { buyTargetsPatchSchema } from '../../../../../shared/schemas/reports'

export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'owner')
  const patch = await validBody(event, buyTargetsPatchSchema)
  return await buyCheckUpdateTargets(access, patch)
})
