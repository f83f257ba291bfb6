// Upload checks and re-encoding (server/utils/images.ts): by content, never by name or declared type.
import { describe, expect, it } from 'vitest'
import sharp from 'sharp'
import { checkPhotoImage, PhotoImageError, processPhotoImage, sniffPhotoFormat } from '../../server/utils/images'
import { PHOTO_MAX_BYTES, PHOTO_NOT_AN_IMAGE, PHOTO_TOO_LARGE } from '../../shared/photos'
import { exifGpsTags, HTML_PAYLOAD, jpegWithGps, meanColour, sidewaysJpeg, SVG_PAYLOAD } from '../support/photos'

async function refusal(bytes: Buffer): Promise<PhotoImageError> {
  const error = await processPhotoImage(bytes).then(() => null, (e: unknown) => e)
  expect(error).toBeInstanceOf(PhotoImageError)
  return error as PhotoImageError
}

describe('sniffPhotoFormat', () => {
  it('knows JPEG, PNG and WebP by their first bytes, and nothing else', async () => {
    const pixel = sharp({ create: { width: 2, height: 2, channels: 3, background: '#123456' } })
    expect(sniffPhotoFormat(await pixel.clone().jpeg().toBuffer())).toBe('jpeg')
    expect(sniffPhotoFormat(await pixel.clone().png().toBuffer())).toBe('png')
    expect(sniffPhotoFormat(await pixel.clone().webp().toBuffer())).toBe('webp')
    expect(sniffPhotoFormat(await pixel.clone().gif().toBuffer())).toBeNull()
    expect(sniffPhotoFormat(Buffer.from(SVG_PAYLOAD))).toBeNull()
    expect(sniffPhotoFormat(Buffer.from('RIFF\0\0\0\0WAVEfmt '))).toBeNull()
    expect(sniffPhotoFormat(Buffer.alloc(0))).toBeNull()
  })
})

describe('re-encoding', () => {
  it('removes GPS and every other piece of metadata', async () => {
    const original = await jpegWithGps()
    const before = await sharp(original).metadata()
    expect(exifGpsTags(before.exif)).toEqual(expect.arrayContaining([1, 2, 3, 4]))
    expect(before.exif!.includes('Testcam')).toBe(true)

    const { display, thumb } = await processPhotoImage(original)
    for (const copy of [display, thumb]) {
      const after = await sharp(copy.bytes).metadata()
      expect(after.format).toBe('webp')
      expect(after.exif).toBeUndefined()
      expect(after.xmp).toBeUndefined()
      expect(after.icc).toBeUndefined()
      expect(exifGpsTags(after.exif)).toBeNull()
      expect(copy.bytes.includes('Testcam')).toBe(false)
    }
  })

  it('drops XMP and converts an embedded colour profile to plain sRGB', async () => {
    const xmp = '<x:xmpmeta xmlns:x="adobe:ns:meta/"><rdf:RDF xmlns:rdf="http://www.w3.org/1999/02/22-rdf-syntax-ns#">'
      + '<rdf:Description xmlns:exif="http://ns.adobe.com/exif/1.0/" exif:GPSLatitude="51,30.2N"/></rdf:RDF></x:xmpmeta>'
    const original = await sharp({ create: { width: 300, height: 200, channels: 3, background: '#33aa55' } })
      .withXmp(xmp).withIccProfile('p3').jpeg().toBuffer()
    const before = await sharp(original).metadata()
    expect(before.xmp).toBeDefined()
    expect(before.icc).toBeDefined()
    const { display } = await processPhotoImage(original)
    const after = await sharp(display.bytes).metadata()
    expect(after.xmp).toBeUndefined()
    expect(after.icc).toBeUndefined()
    expect(after.space).toBe('srgb')
    expect(display.bytes.includes('GPSLatitude')).toBe(false)
  })

  it('turns a sideways photo upright from its EXIF orientation, and drops the tag', async () => {
    const original = await sidewaysJpeg()
    const before = await sharp(original).metadata()
    expect([before.width, before.height, before.orientation]).toEqual([400, 200, 6])

    const { source, display } = await processPhotoImage(original)
    expect([source.width, source.height]).toEqual([200, 400])
    expect([display.width, display.height]).toEqual([200, 400])
    const after = await sharp(display.bytes).metadata()
    expect(after.orientation).toBeUndefined()
    const top = await meanColour(display.bytes, { left: 20, top: 20, width: 160, height: 160 })
    const bottom = await meanColour(display.bytes, { left: 20, top: 220, width: 160, height: 160 })
    expect(top[0]).toBeGreaterThan(200)
    expect(top[2]).toBeLessThan(60)
    expect(bottom[2]).toBeGreaterThan(200)
    expect(bottom[0]).toBeLessThan(60)
  })

  it('makes a display copy of at most 1600 px and a thumbnail of at most 320 px, keeping the proportions', async () => {
    const original = await sharp({ create: { width: 4000, height: 3000, channels: 3, background: '#777777' } }).png().toBuffer()
    const { display, thumb } = await processPhotoImage(original)
    expect([display.width, display.height]).toEqual([1600, 1200])
    expect([thumb.width, thumb.height]).toEqual([320, 240])
    expect(display.contentType).toBe('image/webp')
    expect(thumb.bytes.length).toBeLessThan(display.bytes.length)
  })

  it('does not enlarge small images', async () => {
    const original = await sharp({ create: { width: 120, height: 90, channels: 3, background: '#777777' } }).webp().toBuffer()
    const { display, thumb } = await processPhotoImage(original)
    expect([display.width, display.height]).toEqual([120, 90])
    expect([thumb.width, thumb.height]).toEqual([120, 90])
  })
})

describe('refusals', () => {
  it('refuses a text file named .jpg (the name is never looked at)', async () => {
    const error = await refusal(Buffer.from('Shopping list: glue, tissue paper, bubble wrap.\n'))
    expect(error.statusCode).toBe(415)
    expect(error.message).toBe(PHOTO_NOT_AN_IMAGE)
  })

  it('refuses SVG, even though the image library could draw it', async () => {
    expect((await sharp(Buffer.from(SVG_PAYLOAD)).metadata()).format).toBe('svg')
    const error = await refusal(Buffer.from(SVG_PAYLOAD))
    expect(error.statusCode).toBe(415)
    expect(error.message).toBe(PHOTO_NOT_AN_IMAGE)
  })

  it('refuses HTML', async () => {
    expect((await refusal(Buffer.from(HTML_PAYLOAD))).statusCode).toBe(415)
  })

  it('refuses GIF and TIFF, which sharp reads but the product does not accept', async () => {
    const pixel = sharp({ create: { width: 8, height: 8, channels: 3, background: '#123456' } })
    expect((await refusal(await pixel.clone().gif().toBuffer())).statusCode).toBe(415)
    expect((await refusal(await pixel.clone().tiff().toBuffer())).statusCode).toBe(415)
  })

  it('refuses a polyglot: JPEG magic bytes followed by HTML', async () => {
    const polyglot = Buffer.concat([Buffer.from([0xFF, 0xD8, 0xFF, 0xE0]), Buffer.from(HTML_PAYLOAD)])
    expect(sniffPhotoFormat(polyglot)).toBe('jpeg')
    const error = await refusal(polyglot)
    expect(error.statusCode).toBe(415)
    expect(error.message).toBe(PHOTO_NOT_AN_IMAGE)
  })

  it('neutralises a valid JPEG with HTML appended: only re-encoded pixels come out', async () => {
    const jpeg = await sharp({ create: { width: 64, height: 64, channels: 3, background: '#abcdef' } }).jpeg().toBuffer()
    const polyglot = Buffer.concat([jpeg, Buffer.from(HTML_PAYLOAD)])
    const { display, thumb } = await processPhotoImage(polyglot)
    for (const copy of [display, thumb]) {
      expect(sniffPhotoFormat(copy.bytes)).toBe('webp')
      expect(copy.bytes.includes('<script')).toBe(false)
      expect(copy.bytes.includes('<html')).toBe(false)
    }
  })

  it('refuses a PNG whose extension, type and magic claim one thing while the body is another', async () => {
    const png = await sharp({ create: { width: 16, height: 16, channels: 3, background: '#000' } }).png().toBuffer()
    const fake = Buffer.concat([png.subarray(0, 8), Buffer.from(HTML_PAYLOAD)])
    expect((await refusal(fake)).statusCode).toBe(415)
  })

  it('refuses a truncated JPEG rather than storing half a picture', async () => {
    const jpeg = await sharp({ create: { width: 400, height: 300, channels: 3, background: '#abcdef' } }).jpeg().toBuffer()
    expect((await refusal(jpeg.subarray(0, Math.floor(jpeg.length / 2)))).statusCode).toBe(415)
  })

  it('refuses more than 15 MB with 413 before decoding anything', async () => {
    const tooBig = Buffer.alloc(PHOTO_MAX_BYTES + 1)
    tooBig.set([0xFF, 0xD8, 0xFF], 0)
    const error = await checkPhotoImage(tooBig).then(() => null, (e: unknown) => e as PhotoImageError)
    expect(error?.statusCode).toBe(413)
    expect(error?.message).toBe(PHOTO_TOO_LARGE)
  })

  it('refuses a decompression bomb (a small PNG claiming over 100 megapixels) with 400', async () => {
    const bomb = await sharp({ create: { width: 12_000, height: 9_000, channels: 3, background: '#000' } }).png({ compressionLevel: 9 }).toBuffer()
    expect(bomb.length).toBeLessThan(PHOTO_MAX_BYTES)
    const error = await refusal(bomb)
    expect(error.statusCode).toBe(400)
    expect(error.message).toMatch(/megapixels/)
  })
})
