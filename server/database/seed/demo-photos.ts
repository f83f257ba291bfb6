// Demo photos of maker's marks, drawn rather than photographed: an SVG of a stamped mark on a glazed
// ceramic base (glaze gradient, foot ring, grain, crazing, kiln specks, ink dropouts), rendered with
// sharp to JPEG.
// Deterministic for a seed, so the demo team looks the same on every machine. Fonts: DejaVu, from
// Debian's fonts-dejavu-core (scripts/ensure-system.sh installs it).
import sharp from 'sharp'

export type DemoMarkShape = 'round' | 'oval' | 'shield' | 'banner'

export interface DemoMarkOptions {
  shape: DemoMarkShape
  /** The ink colour, a CSS colour such as '#1d3f8a'. */
  colour: string
  seed: number
  /** Width and height in pixels (default 600). */
  size?: number
}

/** mulberry32: a tiny seeded generator, good enough for specks and wobble. */
function seeded(seed: number): () => number {
  let a = (seed >>> 0) || 0x9E3779B9
  return () => {
    a = (a + 0x6D2B79F5) >>> 0
    let t = a
    t = Math.imul(t ^ (t >>> 15), t | 1)
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61)
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296
  }
}

function xml(text: string): string {
  return text.replace(/[&<>"']/g, c => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', '\'': '&apos;' }[c]!))
}

const GLAZES = [
  ['#f7f3ea', '#e9e1d0', '#cfc3ab'],
  ['#f4f1ec', '#e4e0d8', '#c4bdb1'],
  ['#f6efe2', '#eadcc4', '#cdb896'],
  ['#eef1ee', '#dde3de', '#b9c2bb'],
] as const

const SERIF = 'DejaVu Serif, DejaVu Sans, serif'
const SANS = 'DejaVu Sans Condensed, DejaVu Sans, sans-serif'

// Average advance of a bold capital as a share of the font size (librsvg cannot measure text for us).
const SERIF_RATIO = 0.78
const SANS_RATIO = 0.66

function fitFontSize(text: string, width: number, max: number, ratio: number): number {
  return Math.max(10, Math.min(max, width / Math.max(1, text.length * ratio)))
}

function textLines(lines: string[], cx: number, top: number, bottom: number, width: number, font: string, ratio: number): string {
  if (!lines.length) return ''
  const step = (bottom - top) / lines.length
  return lines.map((line, i) => {
    const size = fitFontSize(line, width, step * 0.8, ratio)
    const y = top + step * (i + 0.5) + size * 0.35
    return `<text x="${cx}" y="${y.toFixed(1)}" font-family="${font}" font-size="${size.toFixed(1)}" font-weight="bold" text-anchor="middle" letter-spacing="1">${xml(line)}</text>`
  }).join('')
}

/** Text along the top of a circle, one glyph at a time: librsvg does not render textPath. */
function arcText(text: string, cx: number, cy: number, r: number, s: number): string {
  const glyphs = [...text]
  if (!glyphs.length) return ''
  const sweep = Math.min(Math.PI * 0.95, glyphs.length * 0.16)
  const size = Math.min(s * 0.062, (r * sweep) / glyphs.length / (SERIF_RATIO * 0.85))
  const step = glyphs.length > 1 ? sweep / (glyphs.length - 1) : 0
  return glyphs.map((glyph, i) => {
    const angle = -Math.PI / 2 - sweep / 2 + step * i
    const x = cx + r * Math.cos(angle)
    const y = cy + r * Math.sin(angle)
    const deg = (angle * 180) / Math.PI + 90
    return `<text x="${x.toFixed(1)}" y="${y.toFixed(1)}" transform="rotate(${deg.toFixed(1)} ${x.toFixed(1)} ${y.toFixed(1)})" font-family="${SERIF}" font-size="${size.toFixed(1)}" font-weight="bold" text-anchor="middle">${xml(glyph)}</text>`
  }).join('')
}

function markBody(shape: DemoMarkShape, lines: string[], s: number): string {
  const c = s / 2
  const stroke = (w: number) => `fill="none" stroke="currentColor" stroke-width="${(w * s / 600).toFixed(1)}"`
  switch (shape) {
    case 'round': {
      const r = s * 0.3
      const [arc = '', ...inner] = lines
      return `<circle cx="${c}" cy="${c}" r="${r}" ${stroke(7)}/><circle cx="${c}" cy="${c}" r="${r * 0.9}" ${stroke(2.5)}/>`
        + arcText(arc, c, c, r * 0.7, s)
        + textLines(inner, c, c + r * 0.02, c + r * 0.6, r * 1.25, SANS, SANS_RATIO)
    }
    case 'oval': {
      const rx = s * 0.36
      const ry = s * 0.24
      return `<ellipse cx="${c}" cy="${c}" rx="${rx}" ry="${ry}" ${stroke(6)}/><ellipse cx="${c}" cy="${c}" rx="${rx * 0.9}" ry="${ry * 0.86}" ${stroke(2)}/>`
        + textLines(lines, c, c - ry * 0.62, c + ry * 0.62, rx * 1.45, SERIF, SERIF_RATIO)
    }
    case 'shield': {
      const w = s * 0.5
      const h = s * 0.58
      const x = c - w / 2
      const y = c - h / 2
      const d = `M ${x} ${y} H ${x + w} V ${y + h * 0.55} Q ${x + w} ${y + h * 0.85} ${c} ${y + h} Q ${x} ${y + h * 0.85} ${x} ${y + h * 0.55} Z`
      return `<path d="${d}" ${stroke(6)}/><path d="M ${x + w * 0.12} ${y + h * 0.16} H ${x + w * 0.88}" ${stroke(2)}/>`
        + `<path d="M ${c} ${y + h * 0.05} l ${s * 0.02} ${s * 0.03} h ${-s * 0.04} z" fill="currentColor"/>`
        + textLines(lines, c, y + h * 0.2, y + h * 0.75, w * 0.78, SERIF, SERIF_RATIO)
    }
    case 'banner': {
      const w = s * 0.7
      const h = s * 0.14
      const x = c - w / 2
      const y = c - s * 0.2
      const d = `M ${x} ${y} Q ${c} ${y - h * 0.5} ${x + w} ${y} L ${x + w - h * 0.4} ${y + h * 0.5} L ${x + w} ${y + h} Q ${c} ${y + h * 0.5} ${x} ${y + h} L ${x + h * 0.4} ${y + h * 0.5} Z`
      const [first = '', ...rest] = lines
      return `<path d="${d}" ${stroke(5)}/>`
        + textLines([first], c, y - h * 0.12, y + h * 0.88, w * 0.7, SERIF, SERIF_RATIO)
        + textLines(rest, c, y + h * 1.5, c + s * 0.26, w * 0.85, SANS, SANS_RATIO)
    }
  }
}

interface RawImage { data: Buffer, width: number, height: number }

/** Film grain around mid-grey: neutral under soft-light except for the grain itself. */
function grain(size: number, seed: number): Buffer {
  const rand = seeded(seed)
  const tile = Buffer.alloc(size * size)
  for (let i = 0; i < tile.length; i++) tile[i] = 128 + Math.round((rand() + rand() - 1) * 36)
  return tile
}

// The glazed base (gradient, foot ring, highlight, grain) is the slow part of a drawing and the same for
// every mark: rendered once per glaze and size, kept as raw pixels, and only the mark is drawn per photo.
const bases = new Map<string, Promise<RawImage>>()

function glazedBase(glazeIndex: number, s: number): Promise<RawImage> {
  const key = `${glazeIndex}:${s}`
  let base = bases.get(key)
  if (!base) {
    const glaze = GLAZES[glazeIndex]!
    const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="${s}" height="${s}" viewBox="0 0 ${s} ${s}">
<defs>
  <radialGradient id="glaze" cx="0.42" cy="0.38" r="0.85">
    <stop offset="0" stop-color="#ffffff"/><stop offset="0.25" stop-color="${glaze[0]}"/>
    <stop offset="0.7" stop-color="${glaze[1]}"/><stop offset="1" stop-color="${glaze[2]}"/>
  </radialGradient>
  <radialGradient id="foot" cx="0.5" cy="0.5" r="0.5">
    <stop offset="0.82" stop-color="#000" stop-opacity="0"/><stop offset="0.9" stop-color="#6b5b45" stop-opacity="0.35"/>
    <stop offset="0.94" stop-color="#fff" stop-opacity="0.35"/><stop offset="1" stop-color="#3a3024" stop-opacity="0.45"/>
  </radialGradient>
</defs>
<rect width="${s}" height="${s}" fill="url(#glaze)"/>
<rect width="${s}" height="${s}" fill="url(#foot)"/>
</svg>`
    base = sharp(Buffer.from(svg))
      .composite([{ input: grain(s, glazeIndex + 1), raw: { width: s, height: s, channels: 1 }, blend: 'soft-light' }])
      .removeAlpha()
      .raw()
      .toBuffer({ resolveWithObject: true })
      .then(({ data, info }) => ({ data, width: info.width, height: info.height }))
    base.catch(() => bases.delete(key))
    bases.set(key, base)
  }
  return base
}

/** Renders one mark photo as JPEG: about 15–20 ms of CPU at 600 px once the glaze for that size is cached. */
export async function drawMarkPhoto(inscriptionLines: string[], options: DemoMarkOptions): Promise<Buffer> {
  const s = Math.round(options.size ?? 600)
  const rand = seeded(options.seed)
  const glazeIndex = Math.floor(rand() * GLAZES.length)
  const tilt = (rand() - 0.5) * 16
  const dx = (rand() - 0.5) * s * 0.05
  const dy = (rand() - 0.5) * s * 0.05

  // Crazing: fine, wandering hairlines across the glaze.
  let crazing = ''
  for (let i = 0; i < 14; i++) {
    let x = rand() * s
    let y = rand() * s
    let d = `M ${x.toFixed(0)} ${y.toFixed(0)}`
    for (let j = 0; j < 6; j++) {
      x += (rand() - 0.5) * s * 0.22
      y += (rand() - 0.5) * s * 0.22
      d += ` L ${x.toFixed(0)} ${y.toFixed(0)}`
    }
    crazing += `<path d="${d}" fill="none" stroke="#7d705c" stroke-opacity="${(0.08 + rand() * 0.12).toFixed(2)}" stroke-width="${(0.6 + rand()).toFixed(1)}"/>`
  }
  // Kiln specks in the body, and dropouts where the stamp did not take the ink (glaze-coloured dots on
  // top: an SVG mask would cost a third of the drawing time).
  let specks = ''
  for (let i = 0; i < 90; i++) {
    specks += `<circle cx="${(rand() * s).toFixed(0)}" cy="${(rand() * s).toFixed(0)}" r="${(0.6 + rand() * 1.8).toFixed(1)}" fill="#5b4a36" fill-opacity="${(0.15 + rand() * 0.45).toFixed(2)}"/>`
  }
  let dropouts = ''
  for (let i = 0; i < 70; i++) {
    dropouts += `<circle cx="${(s * 0.22 + rand() * s * 0.56).toFixed(0)}" cy="${(s * 0.22 + rand() * s * 0.56).toFixed(0)}" r="${(1 + rand() * 5).toFixed(1)}"/>`
  }
  const hx = s * (0.26 + rand() * 0.08)
  const hy = s * (0.18 + rand() * 0.08)

  const overlay = `<svg xmlns="http://www.w3.org/2000/svg" width="${s}" height="${s}" viewBox="0 0 ${s} ${s}">
${crazing}${specks}
<g color="${xml(options.colour)}" fill="currentColor" fill-opacity="0.86" stroke-opacity="0.86"
   transform="translate(${dx.toFixed(1)} ${dy.toFixed(1)}) rotate(${tilt.toFixed(1)} ${s / 2} ${s / 2})">
${markBody(options.shape, inscriptionLines, s)}
</g>
<g fill="${GLAZES[glazeIndex]![0]}" fill-opacity="0.9">${dropouts}</g>
<ellipse cx="${hx.toFixed(0)}" cy="${hy.toFixed(0)}" rx="${s * 0.16}" ry="${s * 0.05}" fill="#fff" fill-opacity="0.28" transform="rotate(-24 ${hx.toFixed(0)} ${hy.toFixed(0)})"/>
</svg>`
  const base = await glazedBase(glazeIndex, s)
  return await sharp(base.data, { raw: { width: base.width, height: base.height, channels: 3 } })
    .composite([{ input: Buffer.from(overlay) }])
    .jpeg({ quality: 84, mozjpeg: false })
    .toBuffer()
}
