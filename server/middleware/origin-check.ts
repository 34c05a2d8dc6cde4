/**
 * Cross-site request forgery guard for state-changing API calls. The session cookie is
 * SameSite=Lax already; on top, a browser-sent Origin must be this server's own.
 * Requests without an Origin header (scripts, curl, the test client) are allowed: they
 * carry no ambient browser credentials a third-party page could borrow.
 */
const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS'])

export default defineEventHandler((event) => {
  if (SAFE_METHODS.has(event.method) || !event.path.startsWith('/api/')) return
  const origin = getRequestHeader(event, 'origin')
  if (!origin) return
  // X-Forwarded-Host is believed only behind a proxy we were told to trust (NUXT_TRUST_PROXY).
  const forwarded = isOn(useRuntimeConfig().trustProxy) ? getRequestHeader(event, 'x-forwarded-host') : undefined
  const host = forwarded ?? getRequestHeader(event, 'host')
  let originHost: string
  try {
    originHost = new URL(origin).host
  }
  catch {
    originHost = ''
  }
  if (!host || originHost !== host) {
    throw createError({ statusCode: 403, statusMessage: 'Cross-site request refused' })
  }
})
