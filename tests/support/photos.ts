// Helpers for photo tests: images with known metadata, an EXIF reader for the GPS block, multipart uploads.
import sharp from 'sharp'
import { query } from './db'

/** A JPEG whose EXIF carries a GPS position (and a camera make), as phones write them. */
export async function jpegWithGps(width = 640, height = 480): Promise<Buffer> {
  const plain = await sharp({ create: { width, height, channels: 3, background: '#b04a2f' } }).jpeg().toBuffer()
  return await sharp(plain).withExif({
    IFD0: { Make: 'Testcam', Model: 'Bench 1' },
    IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '51/1 30/1 1234/100', GPSLongitudeRef: 'W', GPSLongitude: '0/1 7/1 3900/100' },
  }).jpeg().toBuffer()
}

/**
 * A JPEG stored sideways with EXIF orientation 6 ("rotate 90° clockwise to view"): stored 400 × 200,
 * left half red and right half blue, so upright it is 200 × 400 with red on top.
 */
export async function sidewaysJpeg(): Promise<Buffer> {
  const red = await sharp({ create: { width: 200, height: 200, channels: 3, background: '#ff0000' } }).png().toBuffer()
  const blue = await sharp({ create: { width: 200, height: 200, channels: 3, background: '#0000ff' } }).png().toBuffer()
  return await sharp({ create: { width: 400, height: 200, channels: 3, background: '#000000' } })
    .composite([{ input: red, left: 0, top: 0 }, { input: blue, left: 200, top: 0 }])
    .withMetadata({ orientation: 6 })
    .jpeg({ quality: 95 })
    .toBuffer()
}

/** The tag numbers in the GPS IFD of an EXIF block (sharp's metadata().exif), or null when there is none. */
export function exifGpsTags(exif: Buffer | undefined): number[] | null {
  if (!exif || exif.length < 14) return null
  const tiff = exif.subarray(exif.subarray(0, 6).toString('latin1') === 'Exif\0\0' ? 6 : 0)
  const order = tiff.subarray(0, 2).toString('latin1')
  if (order !== 'II' && order !== 'MM') throw new Error('not a TIFF header in the EXIF block')
  const le = order === 'II'
  const u16 = (at: number) => le ? tiff.readUInt16LE(at) : tiff.readUInt16BE(at)
  const u32 = (at: number) => le ? tiff.readUInt32LE(at) : tiff.readUInt32BE(at)
  const ifd0 = u32(4)
  let gps = 0
  for (let i = 0; i < u16(ifd0); i++) {
    const entry = ifd0 + 2 + i * 12
    if (u16(entry) === 0x8825) gps = u32(entry + 8)
  }
  if (!gps) return null
  return Array.from({ length: u16(gps) }, (_, i) => u16(gps + 2 + i * 12))
}

/** The mean RGB of a region of an image, to check where colours ended up. */
export async function meanColour(image: Buffer, region: { left: number, top: number, width: number, height: number }): Promise<[number, number, number]> {
  // stats() looks at the input, not the pipeline: extract into a buffer of its own first.
  const stats = await sharp(await sharp(image).extract(region).png().toBuffer()).stats()
  return [stats.channels[0]!.mean, stats.channels[1]!.mean, stats.channels[2]!.mean]
}

/** A multipart body with the file under "file" (name and declared type are the client's claim only). */
export function photoForm(bytes: Uint8Array, options: { name?: string, type?: string, fields?: Record<string, string | number> } = {}): FormData {
  const form = new FormData()
  form.set('file', new Blob([new Uint8Array(bytes)], { type: options.type ?? 'image/jpeg' }), options.name ?? 'photo.jpg')
  for (const [key, value] of Object.entries(options.fields ?? {})) form.set(key, String(value))
  return form
}

export const HTML_PAYLOAD = '<!doctype html><html><body><script>document.title="owned"</script></body></html>'
export const SVG_PAYLOAD = '<svg xmlns="http://www.w3.org/2000/svg" width="64" height="64"><script>alert(1)</script><rect width="64" height="64" fill="red"/></svg>'

/** GETs a photo URL as bytes (the JSON client in api.ts reads bodies as text, which would mangle them). */
export async function fetchPhoto(person: { cookieHeader: () => string }, path: string): Promise<{ status: number, headers: Headers, bytes: Buffer }> {
  const base = process.env.TALLYMARK_TEST_URL
  if (!base) throw new Error('TALLYMARK_TEST_URL is not set: run API tests through npm test.')
  const cookie = person.cookieHeader()
  const res = await fetch(base + path, { headers: cookie ? { cookie } : {}, redirect: 'manual' })
  return { status: res.status, headers: res.headers, bytes: Buffer.from(await res.arrayBuffer()) }
}

/** Where the app under test keeps local uploads (npm test passes STORAGE_DIR to both the app and vitest). */
export function testStorageDir(): string {
  const dir = process.env.STORAGE_DIR
  if (!dir) throw new Error('STORAGE_DIR is not set: run API tests through npm test.')
  return dir
}

/**
 * Inserts a bare reference entry straight into the database, so photo tests do not depend on the wiki's
 * own API. Only the columns without defaults are filled.
 */
export async function insertEntry(kind: 'mark' | 'maker', teamId: number, userId: number, options: { deleted?: boolean } = {}): Promise<number> {
  const [table, label] = kind === 'mark' ? ['marks', 'title'] : ['makers', 'name']
  const columns = kind === 'maker' ? ', other_names' : ''
  const values = kind === 'maker' ? ', \'[]\'' : ''
  const result = await query<never>(
    `insert into ${table} (team_id, ${label}, tags, notes, created_by, updated_by, deleted_at${columns}) values (?, ?, '[]', '', ?, ?, ?${values})`,
    [teamId, `Photo test ${kind} ${Date.now().toString(36)}`, userId, userId, options.deleted ? new Date() : null],
  ) as unknown as { insertId: number }
  return Number(result.insertId)
}
