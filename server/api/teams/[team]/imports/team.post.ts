// A team export (multipart field "file", a .zip) into this team, which must be empty: 409 when it has data,
// 400 with what is wrong when the file does not pass, and then nothing is written.
export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'owner')
  const upload = await transferReadUpload(event)
  try {
    return await transferImportTeam(access, upload.path)
  }
  finally {
    await upload.cleanup()
  }
})
