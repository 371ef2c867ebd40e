// Tamp: the field-crew daybook. Settings are read at run time from NUXT_* variables (see .env.example).
export default defineNuxtConfig({
  compatibilityDate: '2026-11-01',
  modules: [
    '@nuxt/eslint', '@pinia/nuxt', '@nuxtjs/tailwindcss', 'nuxt-auth-utils', '@nuxtjs/i18n', '@vite-pwa/nuxt',
    // The development mail inbox page exists only in development.
    (_options, nuxt) => {
      if (nuxt.options.dev) return
      nuxt.hook('pages:extend', (pages) => {
        const index = pages.findIndex(page => page.path === '/dev/mail')
        if (index >= 0) pages.splice(index, 1)
      })
    },
  ],
  devtools: { enabled: false },
  css: [
    '@fontsource/atkinson-hyperlegible/400.css',
    '@fontsource/atkinson-hyperlegible/700.css',
  ],
  app: {
    head: {
      htmlAttrs: { lang: 'en' },
      title: 'Tamp',
      meta: [
        { name: 'viewport', content: 'width=device-width, initial-scale=1, viewport-fit=cover' },
        { name: 'description', content: 'The daybook for hardscape crews, their foreman and the office.' },
        { name: 'theme-color', content: '#1f3a2e' },
      ],
      link: [
        { rel: 'icon', type: 'image/png', sizes: '32x32', href: '/icons/tamp-32.png' },
        { rel: 'apple-touch-icon', sizes: '180x180', href: '/icons/tamp-apple-touch-180.png' },
      ],
    },
  },
  runtimeConfig: {
    db: {
      host: '127.0.0.1',
      port: 3307,
      user: 'tamp',
      password: '',
      name: 'tamp',
    },
    session: {
      // A crew lead may stay offline for a week or more: 30 days unless configured.
      maxAge: 60 * 60 * 24 * 30,
      password: '',
      // Secure by default; dropped on plain HTTP by server/middleware/00.session-cookie.ts.
      cookie: { sameSite: 'lax', httpOnly: true, secure: true },
    },
    mail: {
      smtpHost: '127.0.0.1',
      smtpPort: 2525,
      smtpSecure: false,
      smtpUser: '',
      smtpPassword: '',
      from: 'Tamp <daybook@tamp.local>',
    },
    // The mail outbox's timer (server/plugins/mail-outbox.ts): how often it queues and sends (0 = off),
    // the hour in each company's time zone after which the day's unapproved sheets are reported too,
    // and how many tries a message gets.
    reports: {
      intervalSeconds: 60,
      eveningHour: 19,
      maxAttempts: 10,
    },
    // Where links in e-mails point (https://tamp.example.com); the request's own address when empty.
    appUrl: '',
    // Behind a reverse proxy, believe its X-Forwarded-For for the per-address sign-in throttle.
    trustProxy: false,
    // Set by `npm run dev` to the local mail catcher, for the development inbox.
    mailCatcherUrl: '',
    photos: {
      // 'fs' (under dir) or 's3' (any S3-compatible store).
      driver: 'fs',
      dir: '.data/photos',
      // An upload that sends nothing for idleSeconds, or is not complete after totalSeconds, gets 408
      // (server/utils/upload-body.ts); 20 MB on a weak 3G link takes a few minutes.
      idleSeconds: 30,
      totalSeconds: 600,
      s3Endpoint: '',
      s3Region: 'us-east-1',
      s3Bucket: '',
      s3AccessKeyId: '',
      s3SecretAccessKey: '',
    },
    public: {
      appName: 'Tamp',
    },
  },
  typescript: {
    strict: true,
    tsConfig: { compilerOptions: { noUncheckedIndexedAccess: true } },
    sharedTsConfig: { compilerOptions: { noUncheckedIndexedAccess: true } },
    nodeTsConfig: {
      compilerOptions: { noUncheckedIndexedAccess: true },
      include: ['../scripts/**/*', '../tests/**/*', '../db/**/*', '../knexfile.ts', '../vitest.config.ts'],
    },
  },
  nitro: {
    plugins: ['~~/server/early/request-start.ts'],
    // The build's JS, CSS and other text files are written brotli- and gzip-compressed beside the
    // originals and served by Accept-Encoding; answers made per request go through server/middleware/02.compression.ts.
    compressPublicAssets: { brotli: true, gzip: true },
    handlers: [{ route: '/api/dev/mail', method: 'get', handler: '~~/server/dev/mail.get.ts', env: 'dev' }],
    typescript: { tsConfig: { compilerOptions: { noUncheckedIndexedAccess: true } } },
  },
  tailwindcss: {
    cssPath: '~/assets/css/main.css',
  },
  // English and Spanish for every crew-facing screen; the language is the user's choice, kept on the phone.
  i18n: {
    locales: [
      { code: 'en', language: 'en-US', name: 'English', file: 'en.json' },
      { code: 'es', language: 'es-US', name: 'Español', file: 'es.json' },
    ],
    defaultLocale: 'en',
    strategy: 'no_prefix',
    detectBrowserLanguage: { useCookie: true, cookieKey: 'tamp_locale', fallbackLocale: 'en', redirectOn: 'no prefix' },
    // No <i18n-t> and friends in any template: vue-i18n's global components stay out of the bundle.
    // (dropMessageCompiler would save 6 KB more but the server then fails to render the compiled
    // messages: "unhandled node type: 0".)
    bundle: { fullInstall: false },
  },
  // The prerendered /shell would otherwise get a payload file with `data: undefined` that Nuxt copies
  // over every page's data (see nuxt/nuxt#34865): no payload extraction, /shell is the only prerender.
  // No app manifest: nothing on the phone reads client-side route rules, and it costs a request and
  // its code on every first load (the service worker's own update check tells of a new build).
  experimental: { payloadExtraction: false, appManifest: false },
  // Every component is written with <script setup>: Vue's Options API is left out of the bundle.
  vite: { define: { __VUE_OPTIONS_API__: 'false' } },
  routeRules: {
    // A page shell rendered without data, precached by the service worker and answered for every
    // navigation offline (SSR pages cannot be precached: see ../shared/STACK.md).
    '/shell': { ssr: false, prerender: true },
  },
  pwa: {
    registerType: 'prompt',
    manifest: {
      name: 'Tamp daybook',
      short_name: 'Tamp',
      description: 'The daybook for hardscape crews, their foreman and the office.',
      theme_color: '#1f3a2e',
      background_color: '#f6f5f2',
      display: 'standalone',
      start_url: '/',
      scope: '/',
      icons: [
        { src: '/icons/tamp-192.png', sizes: '192x192', type: 'image/png' },
        { src: '/icons/tamp-512.png', sizes: '512x512', type: 'image/png' },
        { src: '/icons/tamp-maskable-512.png', sizes: '512x512', type: 'image/png', purpose: 'maskable' },
      ],
    },
    workbox: {
      navigateFallback: '/shell',
      navigateFallbackDenylist: [/^\/api\//],
      globPatterns: ['**/*.{js,css,html,png,svg,woff,woff2,webmanifest}'],
      // Session and API answers are never cached by the service worker; only the translations, which
      // @nuxtjs/i18n serves from /_i18n/<build hash>/, so that a crew lead's language opens offline.
      runtimeCaching: [{ urlPattern: /\/_i18n\//, handler: 'StaleWhileRevalidate', options: { cacheName: 'tamp-i18n' } }],
      cleanupOutdatedCaches: true,
    },
    client: { installPrompt: false, periodicSyncForUpdates: 3600 },
    devOptions: { enabled: false },
  },
  eslint: {
    config: { stylistic: false },
  },
})
