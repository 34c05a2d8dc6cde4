/** One of a person's live sessions, as GET /api/me/sessions lists it. */
export interface SessionView {
  id: string
  /** The session this request came with. */
  current: boolean
  createdAt: string
  lastSeenAt: string
  expiresAt: string
  /** "Firefox on Linux"-style summary, or null. */
  userAgent: string | null
  /** The IPv4 address or IPv6 /64 the session started from, or null. */
  address: string | null
}
