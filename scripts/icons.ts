// npm run icons — renders Tallymark's own app icons from the logo artwork of components/app/AppLogo.vue
// (a tally of five on a round stamp) with sharp: 192 and 512 px "any" icons, 192 and 512 px maskable icons
// (the stamp inside the 80 % safe zone on a full kiln-green square) and a 180 px touch icon. The PNGs are
// committed in public/icons/; run this again only when the logo changes.
import { mkdirSync, readFileSync, statSync } from 'node:fs'
import { join } from 'node:path'
import sharp from 'sharp'

const OUT = join(process.cwd(), 'public', 'icons')
const LOGO = join(process.cwd(), 'components', 'app', 'AppLogo.vue')

/** The logo's <svg> from the component, its Vue-only attributes dropped, as a standalone 32×32 drawing. */
export function logoSvgInner(): string {
  const source = readFileSync(LOGO, 'utf8')
  const svg = /<svg[\s\S]*?<\/svg>/.exec(source)?.[0]
  if (!svg) throw new Error(`No <svg> in ${LOGO}`)
  return svg.replace(/<svg[^>]*>/, '').replace(/<\/svg>/, '')
}

function iconSvg(size: number, maskable: boolean): string {
  const inner = logoSvgInner()
  // Maskable: the platform cuts any shape out of the square, so the whole square is the stamp's colour
  // and the drawing stays inside the central 80 % circle (the "safe zone").
  const scale = maskable ? 0.78 : 1
  const offset = (32 - 32 * scale) / 2
  const background = maskable ? '<rect width="32" height="32" fill="#1f3b36"/>' : ''
  return `<svg xmlns="http://www.w3.org/2000/svg" width="${size}" height="${size}" viewBox="0 0 32 32">${background}`
    + `<g transform="translate(${offset} ${offset}) scale(${scale})">${inner}</g></svg>`
}

async function render(name: string, size: number, maskable: boolean) {
  const file = join(OUT, name)
  await sharp(Buffer.from(iconSvg(size, maskable)), { density: 72 * size / 32 })
    .resize(size, size).png({ compressionLevel: 9, palette: true, quality: 90 }).toFile(file)
  console.log(`${name}: ${size}×${size}, ${statSync(file).size} bytes`)
}

mkdirSync(OUT, { recursive: true })
await render('icon-192.png', 192, false)
await render('icon-512.png', 512, false)
await render('maskable-192.png', 192, true)
await render('maskable-512.png', 512, true)
await render('apple-touch-icon-180.png', 180, true)
