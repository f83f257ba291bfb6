// CSV import of items: multipart `file` and optional `mapping` (JSON {csvColumn: field}); ?dryRun=1 previews,
// ?onlyValid=1 imports the valid rows when some are bad; otherwise one bad row means nothing is written.
import { importMappingSchema, importQuery } from '../../../../../../shared/schemas/ledger'

const MAX_BYTES = 64 * 1024 * 1024

export default defineEventHandler(async (event) => {
  const access = await requireMember(event, 'contributor')
  const query = validQuery(event, importQuery)
  if (Number(getRequestHeader(event, 'content-length') ?? 0) > MAX_BYTES) throw httpError(413, 'The file is larger than 64 MB: split it into parts.')
  const form = await readMultipartFormData(event)
  const file = form?.find(part => part.name === 'file')
  if (!file) throw httpError(400, 'Please check the form: file: attach the CSV file as the "file" field.', { file: ['Attach the CSV file as the "file" field.'] })
  const mappingText = form?.find(part => part.name === 'mapping')?.data.toString('utf8').trim()
  let mapping: Record<string, string> | undefined
  if (mappingText) {
    let raw: unknown
    try {
      raw = JSON.parse(mappingText)
    }
    catch {
      throw httpError(400, 'Please check the form: mapping: it must be JSON like {"Item name": "title"}.', { mapping: ['Send JSON like {"Item name": "title"}.'] })
    }
    const parsed = importMappingSchema.safeParse(raw)
    if (!parsed.success) throw httpError(400, `Please check the form: mapping: ${parsed.error.issues[0]?.message ?? 'invalid'}`, { mapping: parsed.error.issues.map(i => i.message) })
    mapping = parsed.data
  }
  return await ledgerImportItems(access, file.data.toString('utf8'), { ...query, mapping })
})
