// The whole team as one zip (team.json and the photo files). Owners only: it holds every member's e-mail address
// and all of the team's history. The rows are read first, in one short transaction, into a temporary folder (a
// failure there is an ordinary error answer); the zip is then written as it downloads, at the client's pace.
export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'owner')
  // A download closed early ends the export and removes its temporary folder at once.
  const closed = new AbortController()
  event.node.res.on('close', () => closed.abort())
  const snapshot = await transferExportSnapshot(access)
  const day = new Date().toISOString().slice(0, 10)
  setResponseHeader(event, 'content-type', 'application/zip')
  setResponseHeader(event, 'content-disposition', `attachment; filename="${access.team.slug}-team-${day}.zip"`)
  setResponseHeader(event, 'cache-control', 'no-store')
  // Closed early is not an error to answer: nobody is listening, and the zip writer has cleaned up already.
  await sendStream(event, transferExportStream(snapshot, closed.signal)).catch((error: unknown) => {
    if (!closed.signal.aborted) throw error
  })
})
