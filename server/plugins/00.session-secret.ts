import { randomBytes } from 'node:crypto'

/**
 * Sealed-cookie sessions need a secret of at least 32 characters. Production must set
 * NUXT_SESSION_PASSWORD; dev and demo get a fresh one per start, so sessions end on restart.
 */
export default defineNitroPlugin(() => {
  const config = useRuntimeConfig()
  const current = process.env.NUXT_SESSION_PASSWORD || config.session?.password || ''
  if (current.length >= 32) return
  if (!import.meta.dev && process.env.TIDEWRIGHT_DEMO !== '1') {
    console.error('Tidewright cannot start: set NUXT_SESSION_PASSWORD to a random string of at least 32 characters (for example `openssl rand -hex 32`).')
    process.exit(1)
  }
  process.env.NUXT_SESSION_PASSWORD = randomBytes(32).toString('hex')
})
