/**
 * Headers every answer needs: API answers (JSON, CSV) are private to the signed-in person
 * and never stored by a browser or proxy cache (a route may set its own, e.g. uploads);
 * HSTS whenever the session cookie is Secure, so the browser never sends it over plain HTTP.
 */
export default defineEventHandler((event) => {
  if (event.path.startsWith('/api/')) setResponseHeader(event, 'cache-control', 'private, no-store')
  if (useRuntimeConfig().session.cookie?.secure) setResponseHeader(event, 'strict-transport-security', 'max-age=31536000; includeSubDomains')
})
