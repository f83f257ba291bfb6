// Tallymark: root layout (pages/, components/, stores/ at the top), see DEVELOPERS.md.
export default defineNuxtConfig({
  modules: ['@nuxtjs/tailwindcss', '@pinia/nuxt', 'nuxt-auth-utils', '@nuxt/content', '@nuxt/eslint'],
  devtools: { enabled: false },
  app: {
    head: {
      htmlAttrs: { lang: 'en' },
      title: 'Tallymark',
      meta: [
        { name: 'viewport', content: 'width=device-width, initial-scale=1' },
        { name: 'description', content: 'The shared reference of a resale team: maker\'s marks, makers, materials and sale outcomes.' },
        { name: 'theme-color', content: '#1f3b36' },
      ],
    },
  },
  css: ['~/assets/css/main.css'],
  content: { build: { markdown: { toc: { depth: 2 } } } },
  runtimeConfig: {
    // Settings are read from the environment in server/utils/config.ts; the session is nuxt-auth-utils'.
    session: {
      name: 'tallymark-session',
      // Absolute lifetime of the cookie; idle and absolute limits are also checked in server/middleware/1.session.ts.
      maxAge: 60 * 60 * 24 * 30,
      cookie: { sameSite: 'lax', httpOnly: true },
    },
  },
  srcDir: '.',
  // Separate build folders let several builds run side by side (e.g. a second checkout's tests).
  buildDir: process.env.TALLYMARK_BUILD_DIR || '.nuxt',
  compatibilityDate: '2026-06-01',
  nitro: {
    errorHandler: '~~/server/error-handler.ts',
    output: process.env.TALLYMARK_OUTPUT_DIR ? { dir: process.env.TALLYMARK_OUTPUT_DIR } : undefined,
  },
  typescript: { strict: true },
  telemetry: false,
  eslint: { config: { stylistic: true } },
})
