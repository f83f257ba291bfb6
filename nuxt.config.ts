// Tallymark: root layout (pages/, components/, stores/ at the top), see DEVELOPERS.md.
export default defineNuxtConfig({
  modules: ['@nuxtjs/tailwindcss', '@pinia/nuxt', 'nuxt-auth-utils', '@nuxt/content', '@nuxt/eslint', 'nuxt-security', '@vite-pwa/nuxt'],
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
      // The web app manifest and icons of the installable app (pwa below; icons drawn by scripts/icons.ts).
      link: [
        { rel: 'manifest', href: '/manifest.webmanifest' },
        { rel: 'apple-touch-icon', href: '/icons/apple-touch-icon-180.png' },
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
  routeRules: {
    // A team import is one zip of up to 1 GB (TRANSFER_LIMITS in server/utils/transfer/format.ts), streamed to disk.
    // An items CSV may be up to 64 MiB (server/api/teams/[team]/imports/items/index.post.ts), plus its multipart framing.
    '/api/teams/*/imports/items': { security: { requestSizeLimiter: { maxRequestSizeInBytes: 2_000_000, maxUploadFileRequestInBytes: 67_200_000 } } },
    '/api/teams/*/imports/team': { security: { requestSizeLimiter: { maxRequestSizeInBytes: 2_000_000, maxUploadFileRequestInBytes: 1_074_000_000 } } },
  },
  compatibilityDate: '2026-06-01',
  nitro: {
    errorHandler: '~~/server/error-handler.ts',
    output: process.env.TALLYMARK_OUTPUT_DIR ? { dir: process.env.TALLYMARK_OUTPUT_DIR } : undefined,
  },
  typescript: { strict: true },
  telemetry: false,
  eslint: { config: { stylistic: true } },
  // The installable app and its offline behaviour (composables/useOffline*.ts, plugins/offline.client.ts). With SSR the default
  // navigateFallback ('/') is never precached, so it is off; pages are cached as they are visited (NetworkFirst)
  // and an unvisited page falls back to a cached page of the same team. API answers are never cached by the
  // service worker: the team's reference is kept in IndexedDB by composables/useOfflineReference.ts.
  pwa: {
    registerType: 'autoUpdate',
    manifest: {
      id: '/',
      name: 'Tallymark',
      short_name: 'Tallymark',
      description: 'The shared reference of a resale team: maker\'s marks, makers, materials and categories, also with no signal.',
      lang: 'en',
      start_url: '/',
      scope: '/',
      display: 'standalone',
      orientation: 'portrait',
      // kiln-700 and paper from tailwind.config.ts.
      theme_color: '#1f3b36',
      background_color: '#f6f1e7',
      icons: [
        { src: '/icons/icon-192.png', sizes: '192x192', type: 'image/png', purpose: 'any' },
        { src: '/icons/icon-512.png', sizes: '512x512', type: 'image/png', purpose: 'any' },
        { src: '/icons/maskable-192.png', sizes: '192x192', type: 'image/png', purpose: 'maskable' },
        { src: '/icons/maskable-512.png', sizes: '512x512', type: 'image/png', purpose: 'maskable' },
      ],
    },
    workbox: {
      navigateFallback: null,
      // The app shell: every built script, style and font, and the icons. OCR files are cached on first use
      // or by "Download for offline" (they are about 7 MB, too much to fetch on every install).
      globPatterns: ['_nuxt/**/*.{js,css,woff2,svg,png,webp,json}', 'icons/*.png'],
      globIgnores: ['**/ocr/**'],
      cleanupOutdatedCaches: true,
      runtimeCaching: [
        {
          urlPattern: ({ request }) => request.mode === 'navigate',
          handler: 'NetworkFirst',
          options: {
            cacheName: 'tallymark-pages',
            networkTimeoutSeconds: 6,
            matchOptions: { ignoreSearch: true },
            expiration: { maxEntries: 60 },
            cacheableResponse: { statuses: [200] },
            plugins: [{
              // A redirect (to sign-in) is never kept as the page.
              cacheWillUpdate: async ({ response }) => response.redirected ? null : response,
              // Stringified into sw.js: no outer variables. A page never visited here is answered by a
              // cached page of the same team (the app then renders the right page in the browser).
              handlerDidError: async ({ request }) => {
                const cache = await caches.open('tallymark-pages')
                const url = new URL(request.url)
                const team = /^\/t\/[^/]+/.exec(url.pathname)?.[0]
                const tries = team ? [`${team}/offline`, `${team}/read-base`, team] : ['/']
                for (const path of tries) {
                  const hit = await cache.match(new URL(path, url.origin).href, { ignoreSearch: true })
                  if (hit) return hit
                }
                const keys = await cache.keys()
                return (keys.length ? await cache.match(keys[keys.length - 1]!) : undefined) ?? Response.error()
              },
            }],
          },
        },
        {
          urlPattern: ({ url }) => url.pathname.startsWith('/ocr/'),
          handler: 'CacheFirst',
          options: { cacheName: 'tallymark-ocr', expiration: { maxEntries: 10 } },
        },
      ],
    },
  },
  // Security headers and a nonce-based Content-Security-Policy (OWASP ASVS 5.0 V3). HSTS and the
  // __Host- session cookie are switched on at run time in production (server/middleware/0.production.ts).
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
