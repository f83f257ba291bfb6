// Bundles the search worker (server/workers/search.ts) into the server build as search-worker.mjs,
// beside index.mjs: Nitro bundles only what its entry imports, and a worker thread needs a file of its own,
// with everything it imports inside. Under nuxt dev there is none and indexes are built on the main thread.
import { join } from 'node:path'
import { defineNuxtModule } from '@nuxt/kit'
import { build } from 'esbuild'

export default defineNuxtModule({
  meta: { name: 'tallymark-search-worker' },
  setup(_options, nuxt) {
    if (nuxt.options.dev) return
    nuxt.hook('nitro:init', (nitro) => {
      nitro.hooks.hook('compiled', async () => {
        await build({
          entryPoints: [join(nuxt.options.rootDir, 'server/workers/search.ts')],
          outfile: join(nitro.options.output.serverDir, 'search-worker.mjs'),
          bundle: true,
          platform: 'node',
          format: 'esm',
          target: 'node20',
          // The CommonJS packages inside (mysql2) still require() Node's own modules.
          banner: { js: 'import { createRequire as __createRequire } from \'node:module\'; const require = __createRequire(import.meta.url);' },
          legalComments: 'none',
          logLevel: 'warning',
        })
      })
    })
  },
})
