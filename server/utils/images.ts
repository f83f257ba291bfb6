// Image checks and re-encoding for uploaded photos. No Nitro or database here: unit-tested on its own.
// An upload is accepted only when its first bytes AND libvips' decoder agree it is a JPEG, PNG or WebP;
// names and declared types are ignored. Only re-encoded copies leave this module, so metadata (EXIF, GPS,
// XMP, ICC) and anything appended to a valid image (a polyglot's HTML) are dropped with the original.
import sharp, { type Metadata } from 'sharp'
import {
  PHOTO_DISPLAY_MAX_PX, PHOTO_MAX_BYTES, PHOTO_MAX_MEGAPIXELS, PHOTO_NOT_AN_IMAGE, PHOTO_THUMB_MAX_PX, PHOTO_TOO_LARGE,
} from '../../shared/photos'

export type PhotoImageFormat = 'jpeg' | 'png' | 'webp'

/** A refused upload: statusCode is what the API answers (400, 413 or 415), message is for people. */
export class PhotoImageError extends Error {
  constructor(public statusCode: 400 | 413 | 415, message: string) {
    super(message)
    this.name = 'PhotoImageError'
  }
}

/** The format announced by the file's magic bytes, or null. */
export function sniffPhotoFormat(bytes: Uint8Array): PhotoImageFormat | null {
  const b = bytes
  if (b.length >= 3 && b[0] === 0xFF && b[1] === 0xD8 && b[2] === 0xFF) return 'jpeg'
  if (b.length >= 8 && b[0] === 0x89 && b[1] === 0x50 && b[2] === 0x4E && b[3] === 0x47
    && b[4] === 0x0D && b[5] === 0x0A && b[6] === 0x1A && b[7] === 0x0A) return 'png'
  if (b.length >= 12 && ascii(b, 0, 4) === 'RIFF' && ascii(b, 8, 12) === 'WEBP') return 'webp'
  return null
}

function ascii(bytes: Uint8Array, start: number, end: number): string {
  return String.fromCharCode(...bytes.subarray(start, end))
}

const SHARP_INPUT = {
  // Any decoder warning (truncated data, garbage after a header) refuses the file rather than guessing.
  failOn: 'warning',
  // A decompression bomb (a tiny PNG claiming 50 000 × 50 000 pixels) is refused before decoding.
  limitInputPixels: PHOTO_MAX_MEGAPIXELS * 1_000_000,
  // Animated WebP/PNG: the first frame only.
  pages: 1,
} as const

export interface CheckedPhoto { format: PhotoImageFormat, width: number, height: number }

/** Refuses anything that is not a JPEG, PNG or WebP by content; returns the format and the upright size. */
export async function checkPhotoImage(bytes: Buffer): Promise<CheckedPhoto> {
  if (bytes.length > PHOTO_MAX_BYTES) throw new PhotoImageError(413, PHOTO_TOO_LARGE)
  const sniffed = sniffPhotoFormat(bytes)
  if (!sniffed) throw new PhotoImageError(415, PHOTO_NOT_AN_IMAGE)
  let meta: Metadata
  try {
    // Header only: the pixel limit is checked below, with its own message.
    meta = await sharp(bytes, { ...SHARP_INPUT, limitInputPixels: false }).metadata()
  }
  catch {
    throw new PhotoImageError(415, PHOTO_NOT_AN_IMAGE)
  }
  if (meta.format !== sniffed || !meta.width || !meta.height) throw new PhotoImageError(415, PHOTO_NOT_AN_IMAGE)
  if (meta.width * meta.height > PHOTO_MAX_MEGAPIXELS * 1_000_000) {
    throw new PhotoImageError(400, `This image has more than ${PHOTO_MAX_MEGAPIXELS} megapixels. Export a smaller copy and try again.`)
  }
  const upright = meta.autoOrient ?? { width: meta.width, height: meta.height }
  return { format: sniffed, width: upright.width, height: upright.height }
}

export interface EncodedImage { bytes: Buffer, width: number, height: number, contentType: 'image/webp' }
export interface ProcessedPhoto { source: CheckedPhoto, display: EncodedImage, thumb: EncodedImage }

async function encode(bytes: Buffer, maxPx: number, quality: number): Promise<EncodedImage> {
  const { data, info } = await sharp(bytes, SHARP_INPUT)
    // EXIF orientation applied to the pixels; the tag itself goes with the rest of the metadata.
    .autoOrient()
    .resize(maxPx, maxPx, { fit: 'inside', withoutEnlargement: true })
    // sharp's default output: converted to sRGB, no EXIF, XMP, IPTC or ICC profile (no keepMetadata/withMetadata).
    .toColourspace('srgb')
    .webp({ quality, effort: 4, smartSubsample: true })
    .toBuffer({ resolveWithObject: true })
  return { bytes: data, width: info.width, height: info.height, contentType: 'image/webp' }
}

/**
 * Checks an upload and produces the two stored copies: display (at most 1600 px on the long side) and
 * thumbnail (at most 320 px), both WebP, upright, sRGB, without any metadata.
 */
export async function processPhotoImage(bytes: Buffer): Promise<ProcessedPhoto> {
  const source = await checkPhotoImage(bytes)
  try {
    const [display, thumb] = await Promise.all([
      encode(bytes, PHOTO_DISPLAY_MAX_PX, 82),
      encode(bytes, PHOTO_THUMB_MAX_PX, 76),
    ])
    return { source, display, thumb }
  }
  catch {
    // The header was readable but the pixel data is not (truncated or corrupt after the header).
    throw new PhotoImageError(415, PHOTO_NOT_AN_IMAGE)
  }
}
