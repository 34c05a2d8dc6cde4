import * as v from 'valibot'

/** A session's public id (16 random bytes, url-safe base64); never the cookie's token. */
export const SessionIdParams = v.object({
  id: v.pipe(v.string(), v.regex(/^[\w-]{22}$/, 'Not a valid session id.')),
})
