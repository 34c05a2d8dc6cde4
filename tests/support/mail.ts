/**
 * Test helpers for the mail path: read what the real SMTP catcher caught (through the
 * server's GET /api/dev/mail), run the worker at an injected time, and take the catcher
 * down and up again to stage an outage.
 */
import { inject } from 'vitest'
import type { CaughtMail } from '../../scripts/mail-catcher'
import { ApiClient } from './http'

/** A signed-in demo admin per server (the caught mail is read through the server's test route). */
const admins = new Map<string, Promise<ApiClient>>()

/** Everything caught so far, oldest first; `baseURL` picks a server of the test's own. */
export async function caughtMail(baseURL: string = inject('baseURL')): Promise<CaughtMail[]> {
  if (!admins.has(baseURL)) admins.set(baseURL, new ApiClient(baseURL).signIn('admin@tidewright.test'))
  const admin = await admins.get(baseURL)!
  const response = await admin.get<{ items: CaughtMail[] }>('/api/dev/mail')
  if (response.status !== 200) throw new Error(`GET /api/dev/mail answered ${response.status}`)
  return [...response.body.items].reverse()
}

/** Polls until `pick` finds something in the caught mail; fails with `what` after the deadline. */
export async function waitForMail<T>(what: string, pick: (mail: CaughtMail[]) => T | undefined | false, timeoutMs = 20_000, baseURL: string = inject('baseURL')): Promise<T> {
  const deadline = Date.now() + timeoutMs
  for (;;) {
    const found = pick(await caughtMail(baseURL))
    if (found) return found
    if (Date.now() > deadline) throw new Error(`No mail: ${what}`)
    await new Promise(resolve => setTimeout(resolve, 200))
  }
}

export interface TickResult { escalated: number, reminded: number, aquaristsTold: number, digests: number, sent: number, failed: number }

/** Runs the worker once at `now` (test hooks only); `baseURL` picks a server of the test's own. */
export async function tick(now: Date, baseURL: string = inject('baseURL')): Promise<TickResult> {
  const response = await new ApiClient(baseURL).post<TickResult>('/api/dev/worker-tick', { now: now.toISOString() })
  if (response.status !== 200) throw new Error(`worker-tick answered ${response.status}`)
  return response.body
}

/** Stops or starts the catcher's SMTP listener. */
export async function smtp(action: 'stop' | 'start'): Promise<void> {
  const response = await fetch(`${inject('mailControlURL')}/smtp/${action}`, { method: 'POST' })
  if (!response.ok) throw new Error(`catcher ${action}: ${response.status}`)
}

/** The outbox rows the test hooks expose: delivery state without the bodies. */
export interface OutboxState { messageId: string, toAddress: string, kind: string, status: string, attempts: number, lastError: string | null }

export async function outbox(): Promise<OutboxState[]> {
  const response = await new ApiClient().get<{ items: OutboxState[] }>('/api/dev/outbox')
  if (response.status !== 200) throw new Error(`GET /api/dev/outbox answered ${response.status}`)
  return response.body.items
}

/** Polls the outbox until `pick` finds something. */
export async function waitForOutbox<T>(what: string, pick: (rows: OutboxState[]) => T | undefined | false, timeoutMs = 20_000): Promise<T> {
  const deadline = Date.now() + timeoutMs
  for (;;) {
    const found = pick(await outbox())
    if (found) return found
    if (Date.now() > deadline) throw new Error(`Outbox never showed: ${what}`)
    await new Promise(resolve => setTimeout(resolve, 200))
  }
}

/** The token in an e-mailed link such as `/accept-invite?token=...`. */
export function tokenIn(text: string, path: string): string {
  const match = new RegExp(`${path}\\?token=([\\w-]+)`).exec(text)
  if (!match?.[1]) throw new Error(`No ${path} link in: ${text}`)
  return match[1]
}
