/**
 * Single-use links for invitations and password resets, framework-free. The raw token goes into the
 * e-mail only; the database keeps its SHA-256, so a leaked table opens no account.
 */
import { createHash, randomBytes } from 'node:crypto'
import { and, eq, gt, isNull } from 'drizzle-orm'
import type { AuthTokenPurpose } from '#shared/vocabulary'
import type { Db } from '#server/db/connection'
import { authTokens, users } from '#server/db/schema'

export type TokenPurpose = AuthTokenPurpose

/** How long each kind of link stays valid. */
export const TOKEN_TTL_MS: Record<TokenPurpose, number> = { invite: 7 * 86_400_000, reset: 60 * 60_000 }

const hashToken = (token: string) => createHash('sha256').update(token).digest('hex')

/** Makes a new link for the user and retires their older unused links of the same purpose. Returns the raw token. */
export function issueToken(db: Db, userId: string, purpose: TokenPurpose, now = new Date()): string {
  const token = randomBytes(32).toString('base64url')
  db.update(authTokens).set({ usedAt: now.toISOString() })
    .where(and(eq(authTokens.userId, userId), eq(authTokens.purpose, purpose), isNull(authTokens.usedAt))).run()
  db.insert(authTokens).values({
    userId, purpose, tokenHash: hashToken(token),
    expiresAt: new Date(now.getTime() + TOKEN_TTL_MS[purpose]).toISOString(),
    createdAt: now.toISOString(), updatedAt: now.toISOString(),
  }).run()
  return token
}

/** The user a valid (unused, unexpired) token belongs to, without using it. */
export function peekToken(db: Db, token: string, purpose: TokenPurpose | undefined, now = new Date()) {
  const row = db.select({ purpose: authTokens.purpose, user: users }).from(authTokens)
    .innerJoin(users, eq(users.id, authTokens.userId))
    .where(and(eq(authTokens.tokenHash, hashToken(token)), isNull(authTokens.usedAt), gt(authTokens.expiresAt, now.toISOString()))).get()
  if (!row || !row.user.active || (purpose && row.purpose !== purpose)) return undefined
  return row
}

/** Uses the token once: a conditional UPDATE, so two racing requests cannot both succeed. Returns the user id. */
export function consumeToken(db: Db, token: string, purpose: TokenPurpose, now = new Date()): string | undefined {
  const row = db.update(authTokens).set({ usedAt: now.toISOString() })
    .where(and(eq(authTokens.tokenHash, hashToken(token)), eq(authTokens.purpose, purpose), isNull(authTokens.usedAt), gt(authTokens.expiresAt, now.toISOString())))
    .returning({ userId: authTokens.userId }).get()
  return row?.userId
}
