// zod compiles object parsers with `new Function` where it may, and finds out by trying once, when the first
// z.object is built. The page's Content-Security-Policy (nuxt.config.ts) rightly has no 'unsafe-eval', so that
// probe was reported as a violation on every page that loads a schema. In the browser zod parses without
// generated code (the forms' objects are small); the server, which has no such policy, keeps compiled parsers.
// Set when this module loads, not in the plugin's setup: the first page's chunk (and its schemas) is loaded by
// the router before the plugins run; this module is part of the entry and is evaluated before any page chunk.
import { z } from 'zod'

z.config({ jitless: true })

export default defineNuxtPlugin({
  name: 'zod-jitless',
  enforce: 'pre',
  setup() {
    z.config({ jitless: true })
  },
})
