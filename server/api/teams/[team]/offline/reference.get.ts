// GET /api/teams/<team>/offline/reference?since=<cursor>&thumbs=<hash> — the team's reference for the phone:
// everything, or only what changed since the cursor of the last download (compressed when accepted).
import { z } from 'zod'
import { offlineCompressedJson } from '../../../../utils/offline/compress'
import { offlineReference } from '../../../../utils/offline/reference'

const query = z.object({
  since: z.string().max(80, 'since is a cursor from an earlier answer.').optional(),
  thumbs: z.string().max(40, 'thumbs is a hash from an earlier answer.').optional(),
})

export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'viewer')
  const { since, thumbs } = validQuery(event, query)
  setResponseHeader(event, 'cache-control', 'private, no-store')
  return await offlineCompressedJson(event, await offlineReference(useDb(), access, { since, thumbsHash: thumbs }))
})
