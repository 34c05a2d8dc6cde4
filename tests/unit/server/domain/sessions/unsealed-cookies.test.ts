/** What a sealed cookie opened to is kept for the TTL at most, never past the seal's own expiry, and within a fixed number of cookies. */
import { describe, expect, it } from 'vitest'
import { UnsealedCookies } from '../../../../../server/domain/sessions/unsealed-cookies'

describe('UnsealedCookies', () => {
  it('answers within the TTL and not from its end on', () => {
    const cookies = new UnsealedCookies({ ttlMs: 60_000, maxEntries: 10 })
    cookies.remember('sealed-a', 'token-a', 1_000, null)
    expect(cookies.tokenOf('sealed-a', 1_000)).toBe('token-a')
    expect(cookies.tokenOf('sealed-a', 60_999)).toBe('token-a')
    expect(cookies.tokenOf('sealed-a', 61_000)).toBeNull()
    expect(cookies.size).toBe(0)
  })

  it('never keeps an entry past the seal\'s expiry, and keeps none for a seal already expired', () => {
    const cookies = new UnsealedCookies({ ttlMs: 60_000, maxEntries: 10 })
    cookies.remember('sealed-a', 'token-a', 1_000, 5_000)
    expect(cookies.tokenOf('sealed-a', 4_999)).toBe('token-a')
    expect(cookies.tokenOf('sealed-a', 5_000)).toBeNull()
    cookies.remember('sealed-b', 'token-b', 1_000, 1_000)
    expect(cookies.tokenOf('sealed-b', 1_000)).toBeNull()
  })

  it('knows nothing of a cookie it was not given', () => {
    const cookies = new UnsealedCookies({ ttlMs: 60_000, maxEntries: 10 })
    cookies.remember('sealed-a', 'token-a', 0, null)
    expect(cookies.tokenOf('sealed-a-but-changed', 0)).toBeNull()
  })

  it('forgets by cookie, and by token every cookie that opened to it', () => {
    const cookies = new UnsealedCookies({ ttlMs: 60_000, maxEntries: 10 })
    cookies.remember('sealed-a', 'token-a', 0, null)
    cookies.remember('sealed-a2', 'token-a', 0, null)
    cookies.remember('sealed-b', 'token-b', 0, null)
    cookies.forgetCookie('sealed-b')
    expect(cookies.tokenOf('sealed-b', 0)).toBeNull()
    cookies.forgetToken('token-a')
    expect(cookies.tokenOf('sealed-a', 0)).toBeNull()
    expect(cookies.tokenOf('sealed-a2', 0)).toBeNull()
  })

  it('holds at most maxEntries cookies, dropping the oldest first', () => {
    const cookies = new UnsealedCookies({ ttlMs: 60_000, maxEntries: 3 })
    for (const n of [1, 2, 3, 4]) cookies.remember(`sealed-${n}`, `token-${n}`, 0, null)
    expect(cookies.size).toBe(3)
    expect(cookies.tokenOf('sealed-1', 0)).toBeNull()
    expect(cookies.tokenOf('sealed-4', 0)).toBe('token-4')
  })
})
