// Tallymark: root layout (pages/, components/, stores/ at the top), see DEVELOPERS.md.
export default defineNuxtConfig({
  modules: ['@nuxtjs/tailwindcss', '@pinia/nuxt', 'nuxt-auth-utils', '@nuxt/content', '@nuxt/eslint', 'nuxt-security'],
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
  // Security headers and a nonce-based Content-Security-Policy (OWASP ASVS 5.0 V3). HSTS and the
  // __Host- session cookie are switched on at run time in production (server/plugins/production-security.ts).
  security: {
    nonce: true,
    headers: {
      contentSecurityPolicy: {
        'default-src': ['\'self\''],
        // @nuxt/content queries its handbook database in the browser with WASM SQLite.
        'script-src': ['\'self\'', '\'nonce-{{nonce}}\'', '\'strict-dynamic\'', '\'wasm-unsafe-eval\''],
        'style-src': ['\'self\'', '\'unsafe-inline\''],
        'img-src': ['\'self\'', 'data:', 'blob:'],
        'font-src': ['\'self\''],
        'connect-src': ['\'self\''],
        'worker-src': ['\'self\'', 'blob:'],
        'object-src': ['\'none\''],
        'base-uri': ['\'none\''],
        'frame-ancestors': ['\'none\''],
        'form-action': ['\'self\''],
        'upgrade-insecure-requests': false,
      },
      strictTransportSecurity: false,
      crossOriginEmbedderPolicy: false,
      permissionsPolicy: { camera: ['self'], geolocation: [], microphone: [] },
    },
    // Markdown notes legitimately contain "<" and "javascript:" as text; they are rendered safely instead.
    xssValidator: false,
    // Sign-in, reset and invitation have throttles of their own (server/utils/throttle.ts).
    rateLimiter: false,
    requestSizeLimiter: { maxRequestSizeInBytes: 2_000_000, maxUploadFileRequestInBytes: 16_000_000, throwError: true },
    corsHandler: false,
    allowedMethodsRestricter: false,
  },
})
