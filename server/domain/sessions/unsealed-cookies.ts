/**
 * Sealed session cookie -> the session token sealed inside it, kept for a short while so a
 * read does not pay PBKDF2 + AES (iron-webcrypto) on every request.
 *
 * Why this cannot keep anyone signed in: a sealed cookie always opens to the same token, so
 * an entry says only what unsealing would say again. It grants nothing by itself: the token
 * still names a row in `sessions` that is read on every request (with the person and their
 * client record), and sign-out, password reset, deactivation, role changes, an archived
 * client record and both lifetimes all act on that row or that person. Entries are also
 * dropped as soon as their session is seen to have ended, and never outlive the seal.
 * Framework-free; one instance per server process.
 */
export interface UnsealedCookieOptions {
  /** How long an entry is trusted (milliseconds). */
  ttlMs: number
  /** Most cookies kept at once; the oldest entry goes first when full. */
  maxEntries: number
}

interface Entry {
  token: string
  /** Epoch ms after which the entry is not used: the sooner of the TTL and the seal's own expiry. */
  until: number
}

export class UnsealedCookies {
  private readonly entries = new Map<string, Entry>()
  constructor(private readonly options: UnsealedCookieOptions) {}

  /** The token a sealed cookie opened to, if it was opened within the TTL; null otherwise. */
  tokenOf(sealed: string, now: number): string | null {
    const entry = this.entries.get(sealed)
    if (!entry) return null
    if (now >= entry.until) {
      this.entries.delete(sealed)
      return null
    }
    return entry.token
  }

  /** Remembers what a cookie opened to; `sealExpiresAt` (epoch ms, null = none) caps the entry. */
  remember(sealed: string, token: string, now: number, sealExpiresAt: number | null): void {
    const until = Math.min(now + this.options.ttlMs, sealExpiresAt ?? Number.POSITIVE_INFINITY)
    if (until <= now) return
    this.entries.delete(sealed)
    // Maps keep insertion order, so the first key is the oldest entry.
    while (this.entries.size >= this.options.maxEntries) {
      const oldest = this.entries.keys().next().value
      if (oldest === undefined) break
      this.entries.delete(oldest)
    }
    this.entries.set(sealed, { token, until })
  }

  /** Drops one cookie (its session was seen ended, or it is being cleared). */
  forgetCookie(sealed: string): void {
    this.entries.delete(sealed)
  }

  /** Drops every cookie that opened to this token (sign-out of that session). */
  forgetToken(token: string): void {
    for (const [sealed, entry] of this.entries) {
      if (entry.token === token) this.entries.delete(sealed)
    }
  }

  get size(): number {
    return this.entries.size
  }
}
