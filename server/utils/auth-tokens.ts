/** Nitro glue for single-use account links (server/domain/accounts/tokens.ts) on the process's database. */
import { peekToken as peekInDb, type TokenPurpose } from '#server/domain/accounts/tokens'

export { consumeToken, issueToken, TOKEN_TTL_MS, type TokenPurpose } from '#server/domain/accounts/tokens'

/** The user a valid (unused, unexpired) token belongs to, without using it. */
export function peekToken(token: string, purpose: TokenPurpose | undefined, now = new Date()) {
  return peekInDb(useDB(), token, purpose, now)
}
