// Serves the OCR engine from the app itself (never from a CDN): tesseract.js's worker, the LSTM-only WASM
// cores it picks from by browser support, and the English language data from @tesseract.js-data/eng.
// A build copies them into the output's public/ocr/ (so they ship with the app and the service worker can
// cache them); `nuxt dev` serves the same files straight from node_modules.
import { copyFileSync, createReadStream, existsSync, mkdirSync } from 'node:fs'
import { createRequire } from 'node:module'
import { dirname, join } from 'node:path'
import { addDevServerHandler, defineNuxtModule } from '@nuxt/kit'
import { defineEventHandler, sendStream, setResponseHeader } from 'h3'

/** URL path under which the files are served; composables/useOcr.ts uses the same names. */
export const OCR_BASE = '/ocr'

export function ocrAssetFiles(rootDir: string): Record<string, string> {
  const require = createRequire(join(rootDir, 'package.json'))
  const tesseract = dirname(require.resolve('tesseract.js/package.json'))
  const core = dirname(require.resolve('tesseract.js-core/package.json'))
  const eng = dirname(require.resolve('@tesseract.js-data/eng/package.json'))
  return {
    'worker.min.js': join(tesseract, 'dist', 'worker.min.js'),
    'tesseract-core-relaxedsimd-lstm.wasm.js': join(core, 'tesseract-core-relaxedsimd-lstm.wasm.js'),
    'tesseract-core-simd-lstm.wasm.js': join(core, 'tesseract-core-simd-lstm.wasm.js'),
    'tesseract-core-lstm.wasm.js': join(core, 'tesseract-core-lstm.wasm.js'),
    'eng.traineddata.gz': join(eng, '4.0.0_best_int', 'eng.traineddata.gz'),
  }
}

const TYPES: Record<string, string> = { js: 'text/javascript; charset=utf-8', gz: 'application/octet-stream' }

export default defineNuxtModule({
  meta: { name: 'tallymark-ocr-assets' },
  setup(_options, nuxt) {
    const files = ocrAssetFiles(nuxt.options.rootDir)
    for (const [name, path] of Object.entries(files)) if (!existsSync(path)) throw new Error(`OCR file missing: ${path} (${name}); run npm install.`)
    if (nuxt.options.dev) {
      addDevServerHandler({
        route: OCR_BASE,
        handler: defineEventHandler((event) => {
          const name = event.path.replace(/^\//, '').split('?')[0]!
          const path = files[name]
          if (!path) return
          setResponseHeader(event, 'content-type', TYPES[name.split('.').pop()!] ?? 'application/octet-stream')
          return sendStream(event, createReadStream(path))
        }),
      })
      return
    }
    nuxt.hook('nitro:build:public-assets', (nitro) => {
      const dir = join(nitro.options.output.publicDir, OCR_BASE)
      mkdirSync(dir, { recursive: true })
      for (const [name, path] of Object.entries(files)) copyFileSync(path, join(dir, name))
    })
  },
})
