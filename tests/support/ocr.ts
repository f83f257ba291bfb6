// Images of known inscriptions for the OCR tests, drawn by the tests themselves: SVG text rendered by sharp
// in Debian's DejaVu fonts, at several sizes and quarter turns, optionally with grain, blur, low contrast and
// a slight tilt, as a worn base photographed in a dim store looks. Plus Node's OCR with the app's preprocessing.
import { dirname, join } from 'node:path'
import { createRequire } from 'node:module'
import sharp from 'sharp'
import { createWorker, OEM, PSM, type Worker } from 'tesseract.js'
import { ocrBestRotation, ocrPreprocess, ocrScaleFor, type OcrRotation } from '../../shared/ocr/preprocess'

export const OCR_FONTS = ['DejaVu Sans', 'DejaVu Serif', 'DejaVu Sans Mono', 'DejaVu Sans Condensed'] as const

export interface OcrSample { lines: string[], font: string, size: number, rotation: OcrRotation, noisy: boolean, seed: number }

const escapeXml = (s: string) => s.replace(/[&<>"']/g, c => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', '\'': '&apos;' })[c]!)

function seeded(seed: number) {
  let s = seed >>> 0
  return () => {
    s = (s + 0x6D2B79F5) | 0
    let t = Math.imul(s ^ (s >>> 15), 1 | s)
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296
  }
}

/** A PNG of the inscription as printed on a base. */
export async function renderInscription(sample: OcrSample): Promise<Buffer> {
  const { lines, font, size } = sample
  const width = Math.round(Math.max(...lines.map(l => l.length)) * size * 0.72 + size * 2)
  const lineHeight = Math.round(size * 1.5)
  const height = lineHeight * lines.length + size * 2
  const ink = sample.noisy ? '#6b5a48' : '#2b2622'
  const ground = sample.noisy ? '#a8998a' : '#efe8da'
  const text = lines.map((line, i) => `<text x="50%" y="${size * 1.4 + i * lineHeight}" text-anchor="middle" font-family="${font}" font-size="${size}" fill="${ink}">${escapeXml(line)}</text>`).join('')
  const tilt = sample.noisy ? (seeded(sample.seed)() * 6 - 3) : 0
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}"><rect width="100%" height="100%" fill="${ground}"/>`
    + `<g transform="rotate(${tilt.toFixed(2)} ${width / 2} ${height / 2})">${text}</g></svg>`
  let image = sharp(Buffer.from(svg))
  if (sample.noisy) {
    const { data, info } = await image.raw().toBuffer({ resolveWithObject: true })
    const random = seeded(sample.seed)
    // Grain: every pixel nudged, and specks of dust.
    for (let i = 0; i < data.length; i += info.channels) {
      const speck = random() < 0.01 ? (random() < 0.5 ? -90 : 90) : 0
      const d = (random() - 0.5) * 60 + speck
      for (let c = 0; c < 3; c++) data[i + c] = Math.max(0, Math.min(255, data[i + c]! + d))
    }
    image = sharp(data, { raw: info }).blur(1.1)
  }
  return await image.rotate(sample.rotation).png().toBuffer()
}

/** The app's preprocessing (shared/ocr/preprocess.ts) on an image file, as the phone does it on a canvas. */
export async function preprocessForOcr(image: Buffer): Promise<{ png: Buffer, width: number, height: number }> {
  const meta = await sharp(image).metadata()
  const scale = ocrScaleFor(meta.width!, meta.height!)
  const { data, info } = await sharp(image).resize(Math.round(meta.width! * scale), Math.round(meta.height! * scale)).ensureAlpha().raw().toBuffer({ resolveWithObject: true })
  const { rgba } = ocrPreprocess(data, info.width, info.height)
  const png = await sharp(Buffer.from(rgba.buffer), { raw: { width: info.width, height: info.height, channels: 4 } }).png().toBuffer()
  return { png, width: info.width, height: info.height }
}

/** Tesseract in Node with the English data from @tesseract.js-data/eng (nothing downloaded). */
export async function nodeOcrWorker(): Promise<Worker> {
  const require = createRequire(import.meta.url)
  const langPath = join(dirname(require.resolve('@tesseract.js-data/eng/package.json')), '4.0.0_best_int')
  const worker = await createWorker('eng', OEM.LSTM_ONLY, { langPath, gzip: true, cacheMethod: 'none' })
  await worker.setParameters({ tessedit_pageseg_mode: PSM.SINGLE_BLOCK, preserve_interword_spaces: '1' })
  return worker
}

/** Reads an image the way the phone does: preprocess, then the best of the quarter turns. */
export async function readImage(worker: Worker, image: Buffer) {
  const { png } = await preprocessForOcr(image)
  return await ocrBestRotation(async (rotation) => {
    const turned = rotation ? await sharp(png).rotate(rotation).png().toBuffer() : png
    const { data } = await worker.recognize(turned)
    return { text: data.text, confidence: data.confidence }
  })
}

/** Levenshtein distance, for character accuracy: 1 − distance / length of the truth. */
export function editDistance(a: string, b: string): number {
  const prev = Array.from({ length: b.length + 1 }, (_, i) => i)
  for (let i = 1; i <= a.length; i++) {
    let diag = prev[0]!
    prev[0] = i
    for (let j = 1; j <= b.length; j++) {
      const up = prev[j]!
      prev[j] = Math.min(prev[j]! + 1, prev[j - 1]! + 1, diag + (a[i - 1] === b[j - 1] ? 0 : 1))
      diag = up
    }
  }
  return prev[b.length]!
}

export function characterAccuracy(read: string, truth: string): number {
  const norm = (s: string) => s.toUpperCase().replace(/\s+/g, ' ').trim()
  const t = norm(truth)
  return Math.max(0, 1 - editDistance(norm(read), t) / Math.max(1, t.length))
}
