// Photo-to-text preparation shared by the phone (canvas pixels) and the accuracy test (sharp pixels), so both
// read the same image: a size Tesseract reads well, greyscale, contrast stretched, a 3×3 median against dust
// and grain, an Otsu threshold, and dark text on light (impressed marks on a dark glaze come out inverted).
// Plus choosing the best of the four quarter turns, and tidying what was read into search text.

/** Scale for a crop so its longest side is about 1,400 px (small crops grow, phone photos shrink). */
export function ocrScaleFor(width: number, height: number): number {
  const longest = Math.max(width, height)
  if (!longest) return 1
  return Math.min(3, Math.max(0.2, 1400 / longest))
}

function median9(v: Uint8Array, w: number, h: number): Uint8Array {
  const out = new Uint8Array(v.length)
  const win = new Uint8Array(9)
  for (let y = 0; y < h; y++) {
    for (let x = 0; x < w; x++) {
      let n = 0
      for (let dy = -1; dy <= 1; dy++) {
        const yy = Math.min(h - 1, Math.max(0, y + dy))
        for (let dx = -1; dx <= 1; dx++) {
          const xx = Math.min(w - 1, Math.max(0, x + dx))
          win[n++] = v[yy * w + xx]!
        }
      }
      win.sort()
      out[y * w + x] = win[4]!
    }
  }
  return out
}

/** Otsu's threshold of a 256-bin histogram: the split that best separates ink from ground. */
export function otsuThreshold(histogram: ArrayLike<number>, total: number): number {
  let sum = 0
  for (let i = 0; i < 256; i++) sum += i * histogram[i]!
  let sumB = 0
  let weightB = 0
  let best = 0
  let threshold = 127
  for (let i = 0; i < 256; i++) {
    weightB += histogram[i]!
    if (!weightB) continue
    const weightF = total - weightB
    if (!weightF) break
    sumB += i * histogram[i]!
    const meanB = sumB / weightB
    const meanF = (sum - sumB) / weightF
    const between = weightB * weightF * (meanB - meanF) ** 2
    if (between > best) {
      best = between
      threshold = i
    }
  }
  return threshold
}

export interface OcrPreprocessed { rgba: Uint8ClampedArray, inverted: boolean, threshold: number }

/** RGBA pixels in, black-on-white RGBA pixels out (same size). */
export function ocrPreprocess(rgba: ArrayLike<number>, width: number, height: number): OcrPreprocessed {
  const n = width * height
  const grey = new Uint8Array(n)
  for (let i = 0; i < n; i++) grey[i] = Math.round(0.299 * rgba[i * 4]! + 0.587 * rgba[i * 4 + 1]! + 0.114 * rgba[i * 4 + 2]!)
  // Contrast: the darkest and lightest 1 % become black and white.
  const hist = new Uint32Array(256)
  for (let i = 0; i < n; i++) hist[grey[i]!]!++
  const cut = n * 0.01
  let lo = 0
  let hi = 255
  for (let acc = 0; lo < 255 && acc + hist[lo]! <= cut; lo++) acc += hist[lo]!
  for (let acc = 0; hi > 0 && acc + hist[hi]! <= cut; hi--) acc += hist[hi]!
  const span = Math.max(1, hi - lo)
  for (let i = 0; i < n; i++) grey[i] = Math.max(0, Math.min(255, Math.round((grey[i]! - lo) * 255 / span)))
  const smooth = median9(grey, width, height)
  hist.fill(0)
  for (let i = 0; i < n; i++) hist[smooth[i]!]!++
  const threshold = otsuThreshold(hist, n)
  let dark = 0
  for (let i = 0; i < n; i++) if (smooth[i]! <= threshold) dark++
  // Text is the smaller part of a crop: when most of it is dark, the letters are the light part.
  const inverted = dark > n / 2
  const out = new Uint8ClampedArray(n * 4)
  for (let i = 0; i < n; i++) {
    const ink = inverted ? smooth[i]! > threshold : smooth[i]! <= threshold
    const v = ink ? 0 : 255
    out[i * 4] = v
    out[i * 4 + 1] = v
    out[i * 4 + 2] = v
    out[i * 4 + 3] = 255
  }
  return { rgba: out, inverted, threshold }
}

export const OCR_ROTATIONS = [0, 90, 270, 180] as const
export type OcrRotation = typeof OCR_ROTATIONS[number]

export interface OcrReading { text: string, confidence: number, rotation: OcrRotation }

/** What was read, as lines of search text: symbol noise and lines with no real word removed. */
export function ocrCleanText(raw: string): string {
  return raw.split(/\r?\n/)
    .map(line => line.replace(/[^\p{L}\p{N}&'’.,\- ]+/gu, ' ').replace(/\s+/g, ' ').trim())
    .filter(line => (line.match(/[\p{L}\p{N}]/gu) ?? []).length >= 2 && /[\p{L}\p{N}]{2}/u.test(line))
    .join('\n')
}

/** Confidence weighted by how much of the reading is letters and digits (a sideways page reads as "= - —"). */
export function ocrScore(raw: string, confidence: number): number {
  const visible = raw.replace(/\s+/g, '')
  if (!visible) return 0
  const word = (raw.match(/[\p{L}\p{N}]/gu) ?? []).length
  const longWords = (raw.match(/[\p{L}\p{N}]{3,}/gu) ?? []).length
  return confidence * (word / visible.length) * Math.min(1, longWords / 2 + 0.25)
}

/**
 * Reads the image upright first and stops there when the reading is clearly good; otherwise tries the other
 * quarter turns and keeps the best. `recognise` reads the image turned clockwise by `rotation` degrees.
 */
export async function ocrBestRotation(
  recognise: (rotation: OcrRotation) => Promise<{ text: string, confidence: number }>,
  goodEnough = 80,
): Promise<OcrReading & { score: number, tries: (OcrReading & { score: number })[] }> {
  const tries: (OcrReading & { score: number })[] = []
  for (const rotation of OCR_ROTATIONS) {
    const { text, confidence } = await recognise(rotation)
    tries.push({ text: ocrCleanText(text), confidence: Math.round(confidence), rotation, score: ocrScore(text, confidence) })
    if (rotation === 0 && tries[0]!.score >= goodEnough && tries[0]!.text) break
  }
  const best = tries.reduce((a, b) => (b.score > a.score ? b : a))
  return { ...best, tries }
}
