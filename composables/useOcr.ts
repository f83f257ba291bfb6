// Reading a base from a photo, on the phone: tesseract.js in a web worker, with the worker, the WASM core and
// the English data all served by the app itself under /ocr/ (modules/ocr-assets.ts) and cached by the service
// worker on first use, so it works with no signal. The picture is prepared as in shared/ocr/preprocess.ts
// (the accuracy test uses the same code) and read at each quarter turn until one reads well.
import type { Worker } from 'tesseract.js'
import { ocrBestRotation, ocrPreprocess, ocrScaleFor, type OcrReading, type OcrRotation } from '~~/shared/ocr/preprocess'

export const OCR_BASE_URL = '/ocr'
export type OcrProgress = { status: string, progress: number }

let worker: Promise<Worker> | null = null
const listeners = new Set<(p: OcrProgress) => void>()

/** The one OCR worker of the page, started on first use (about 4 MB of engine and 3 MB of language data). */
export function ocrWorker(): Promise<Worker> {
  worker ??= (async () => {
    const { createWorker, OEM, PSM } = await import('tesseract.js')
    const w = await createWorker('eng', OEM.LSTM_ONLY, {
      workerPath: `${OCR_BASE_URL}/worker.min.js`,
      // A folder: tesseract.js picks the core this browser runs fastest (relaxed SIMD, SIMD or plain).
      corePath: `${OCR_BASE_URL}/`,
      langPath: OCR_BASE_URL,
      gzip: true,
      // The service worker caches the files; tesseract's own IndexedDB cache would be a second copy.
      cacheMethod: 'none',
      // Loaded from our own origin, not through a blob: URL.
      workerBlobURL: false,
      logger: (m: OcrProgress) => listeners.forEach(l => l(m)),
    })
    await w.setParameters({ tessedit_pageseg_mode: PSM.SINGLE_BLOCK, preserve_interword_spaces: '1', user_defined_dpi: '300' })
    return w
  })().catch((error: unknown) => {
    worker = null
    throw error
  })
  return worker
}

export function onOcrProgress(listener: (p: OcrProgress) => void): () => void {
  listeners.add(listener)
  return () => listeners.delete(listener)
}

/** A canvas with `source` turned clockwise by `rotation` degrees. */
export function rotatedCanvas(source: HTMLCanvasElement, rotation: number): HTMLCanvasElement {
  const turn = ((rotation % 360) + 360) % 360
  if (!turn) return source
  const out = document.createElement('canvas')
  const sideways = turn === 90 || turn === 270
  out.width = sideways ? source.height : source.width
  out.height = sideways ? source.width : source.height
  const ctx = out.getContext('2d')!
  ctx.translate(out.width / 2, out.height / 2)
  ctx.rotate(turn * Math.PI / 180)
  ctx.drawImage(source, -source.width / 2, -source.height / 2)
  return out
}

/** The prepared black-on-white picture Tesseract reads (shown to the person too, so they see what was read). */
export function prepareForOcr(crop: HTMLCanvasElement): HTMLCanvasElement {
  const scale = ocrScaleFor(crop.width, crop.height)
  const out = document.createElement('canvas')
  out.width = Math.max(1, Math.round(crop.width * scale))
  out.height = Math.max(1, Math.round(crop.height * scale))
  const ctx = out.getContext('2d', { willReadFrequently: true })!
  ctx.imageSmoothingQuality = 'high'
  ctx.drawImage(crop, 0, 0, out.width, out.height)
  const pixels = ctx.getImageData(0, 0, out.width, out.height)
  const { rgba } = ocrPreprocess(pixels.data, out.width, out.height)
  pixels.data.set(rgba)
  ctx.putImageData(pixels, 0, 0)
  return out
}

export interface OcrResult extends OcrReading { tries: (OcrReading & { score: number })[], prepared: HTMLCanvasElement, ms: number }

/** Reads the text of a cropped, upright-as-far-as-the-person-knows picture. */
export async function readBase(crop: HTMLCanvasElement): Promise<OcrResult> {
  const started = performance.now()
  const prepared = prepareForOcr(crop)
  const w = await ocrWorker()
  const best = await ocrBestRotation(async (rotation: OcrRotation) => {
    const { data } = await w.recognize(rotatedCanvas(prepared, rotation))
    return { text: data.text, confidence: data.confidence }
  })
  return { ...best, prepared, ms: Math.round(performance.now() - started) }
}
