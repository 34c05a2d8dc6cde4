// Tidewright's Nuxt configuration. Runtime values are overridden by NUXT_* environment
// variables (NUXT_DB_PATH, NUXT_SESSION_PASSWORD, ...); see README.md.
import { join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { buildWorkers } from './scripts/build-workers.mjs'
import { moduleSideEffects } from './scripts/client-chunks.mjs'

export default defineNuxtConfig({
  modules: ['@nuxtjs/tailwindcss', '@pinia/nuxt', '@vueuse/nuxt', 'nuxt-auth-utils', 'nuxt-security'],
  // Components live in one folder per area but are named by file alone: tanks/TankCard.vue is <TankCard>.
  components: [{ path: '~/components', pathPrefix: false }],
  devtools: { enabled: false },
  app: {
    head: {
      htmlAttrs: { lang: 'en' },
      title: 'Tidewright',
      meta: [
        { name: 'viewport', content: 'width=device-width, initial-scale=1' },
        { name: 'description', content: 'Commissioning new reef aquariums, from empty tank to signed-off cycle.' },
      ],
      link: [{ rel: 'icon', type: 'image/svg+xml', href: '/favicon.svg' }],
    },
  },
  // fonts.css: the three faces in Latin subsets only, with a metric-matched fallback (no reflow on swap).
  css: ['~/assets/css/fonts.css', '~/assets/css/main.css', '~/assets/css/print.css'],
  runtimeConfig: {
    dbPath: 'data/tidewright.sqlite',
    /** Where uploaded photos and PDFs are kept by the fs driver (NUXT_UPLOADS_DIR). */
    uploadsDir: 'data/uploads',
    // 'fs' (default) or 's3' for S3-compatible object storage; see DEVELOPERS.md, "Uploads".
    uploadsDriver: 'fs',
    uploadsS3: { endpoint: '', bucket: '', region: '', accessKeyId: '', secretAccessKey: '' },
    migrationsDir: 'drizzle',
    session: {
      name: 'tidewright-session',
      password: '',
      maxAge: 60 * 60 * 24 * 7,
      cookie: { sameSite: 'lax', httpOnly: true, secure: true },
    },
    // Server-side sessions (NUXT_SESSION_LIFETIME_IDLE_MINUTES, _ABSOLUTE_MINUTES): unused for
    // 3 days or 7 days after sign-in, a session ends. The cookie's maxAge matches the absolute lifetime.
    sessionLifetime: { idleMinutes: 3 * 24 * 60, absoluteMinutes: 7 * 24 * 60 },
    signIn: { accountFailureLimit: 8, addressFailureLimit: 30, windowMinutes: 15 },
    // NUXT_TRUST_PROXY=1 only behind a reverse proxy that sets X-Forwarded-For/-Host itself:
    // otherwise a client could choose its own address (throttles) and host (origin check).
    trustProxy: false,
    // Account e-mails one address, network or inviting account may cause (NUXT_MAIL_THROTTLE_*).
    mailThrottle: { resetPerAddressPerHour: 3, resetPerNetworkPerHour: 20, invitePerAddressPerDay: 3, invitePerAccountPerHour: 30 },
    // NUXT_BENCH_ROUTES=1 enables the benchmark floor routes under server/api/bench (npm run bench only).
    benchRoutes: false,
    // Outgoing mail (NUXT_SMTP_HOST, _PORT, _USER, _PASS, _FROM, _SECURE). No host: mail stays queued in the outbox.
    smtp: { host: '', port: 587, user: '', pass: '', from: 'Tidewright <no-reply@tidewright.invalid>', secure: false },
    // NUXT_DEV_MAIL=1 shows the local mail catcher's messages (NUXT_DEV_MAIL_FILE) at /admin/mail and GET /api/dev/mail.
    devMail: false,
    devMailFile: 'data/mail-caught.jsonl',
    // NUXT_TEST_HOOKS=1 (tests only) enables POST /api/dev/worker-tick with an injected clock.
    testHooks: false,
    // How often the mail worker looks for due mail and runs escalations and reminders.
    workerIntervalMs: 5000,
    // Stored verdicts older than this are made again, on read and by the worker (at most an hour).
    verdictIntervalMs: 900000,
    // How long a write of the request loop waits for another connection's write lock (the pool's
    // import) before answering 503 with Retry-After (NUXT_WRITE_WAIT_MS; the waiting never holds the loop).
    writeWaitMs: 5000,
    public: {
      // Absolute links in e-mails and on certificates (NUXT_PUBLIC_BASE_URL); never taken from a request.
      baseUrl: 'http://localhost:3000',
    },
  },
  experimental: {
    // A link's page is fetched when the pointer or focus reaches it, not when it scrolls into
    // view: the attention board lists every tank, and prefetching each tank page ran the whole
    // tank page's script (charts and forms) on a board that shows none of it.
    defaults: { nuxtLink: { prefetchOn: { visibility: false, interaction: true } } },
  },
  compatibilityDate: '2025-07-15',
  nitro: {
    // Scripts, styles and fonts are stored beside a Brotli and a gzip copy at build time and
    // served by Accept-Encoding; pages and JSON are compressed per answer
    // (server/plugins/20.response-compression.ts).
    compressPublicAssets: { gzip: true, brotli: true },
    // Uploaded files: never under public/, served only through /api/uploads/:id after an access check.
    // The directory comes from NUXT_UPLOADS_DIR at start; S3-compatible storage: DEVELOPERS.md, "Uploads".
    storage: {
      uploads: { driver: 'fs', base: './data/uploads' },
    },
    // The certificate PDF embeds our own font; only the two faces it uses are bundled.
    serverAssets: [{
      baseName: 'fonts',
      dir: fileURLToPath(new URL('./node_modules/@fontsource/source-sans-3/files', import.meta.url)),
      pattern: 'source-sans-3-latin-{400,700}-normal.woff',
    }],
  },
  vite: {
    // Tidewright's components are <script setup>, and Nuxt's, Pinia's and vue-chartjs's use setup()
    // too: without the options API (data, methods, mounted) every page loads 1.6 kB gzip less.
    vue: { features: { optionsAPI: false } },
    // Keeps useAsyncData and useFetch out of the entry script (scripts/client-chunks.mjs).
    build: { rollupOptions: { treeshake: { moduleSideEffects } } },
  },
  typescript: { strict: true, typeCheck: false },
  hooks: {
    // Worker-thread entries (server/workers/) are bundled beside the server once Nitro has
    // built it: see scripts/build-workers.mjs and server/utils/heavy-work.ts.
    'nitro:build:before': (nitro) => {
      nitro.hooks.hook('compiled', () => buildWorkers(nitro.options.rootDir, nitro.options.dev ? join(nitro.options.buildDir, 'dev') : nitro.options.output.serverDir))
    },
  },
  security: {
    nonce: true,
    headers: {
      contentSecurityPolicy: {
        'default-src': ['\'self\''],
        'base-uri': ['\'none\''],
        'connect-src': ['\'self\''],
        'font-src': ['\'self\''],
        'form-action': ['\'self\''],
        'frame-ancestors': ['\'none\''],
        'img-src': ['\'self\'', 'data:', 'blob:'],
        'object-src': ['\'none\''],
        'script-src': ['\'self\'', '\'strict-dynamic\'', '\'nonce-{{nonce}}\''],
        'script-src-attr': ['\'none\''],
        // Vue binds inline style attributes (chart sizes, progress bars).
        'style-src': ['\'self\'', '\'unsafe-inline\''],
        'upgrade-insecure-requests': false,
      },
      crossOriginEmbedderPolicy: false,
      referrerPolicy: 'same-origin',
      // Sent by server/middleware/01.response-headers.ts whenever the session cookie is Secure.
      strictTransportSecurity: false,
    },
    // Sign-in throttling is Tidewright's own (per account and address); a global
    // token bucket would refuse honest bursts such as a day's CSV import.
    rateLimiter: false,
    // Its limiter trusts Content-Length and skips PATCH and chunked bodies; Tidewright counts
    // the bytes of every body itself (server/middleware/00.body-limit.ts).
    requestSizeLimiter: false,
    // Tidewright serves its own pages only; no other origin may call the API.
    corsHandler: false,
    // Input is validated with valibot and Vue escapes output; this filter would refuse
    // honest notes that contain angle brackets.
    xssValidator: false,
  },
  // main.css carries the @tailwind layers; the module must not inject a second copy.
  tailwindcss: { cssPath: false },
})
