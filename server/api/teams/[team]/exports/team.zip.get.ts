// The whole team as one zip (team.json and the photo files), written while it downloads. Owners only: it holds
// every member's e-mail address and all of the team's history.
export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'owner')
  const day = new Date().toISOString().slice(0, 10)
  setResponseHeader(event, 'content-type', 'application/zip')
  setResponseHeader(event, 'content-disposition', `attachment; filename="${access.team.slug}-team-${day}.zip"`)
  setResponseHeader(event, 'cache-control', 'no-store')
  // A download closed early ends the export (and its read transaction) at once.
  const closed = new AbortController()
  event.node.res.on('close', () => closed.abort())
  return sendStream(event, transferExportStream(access, closed.signal))
})
