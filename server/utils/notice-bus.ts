/**
 * The in-process event bus for live notification badges: whoever writes a notice
 * announces the user ids, and each open server-sent-event stream of that user hears it.
 * One process serves Tidewright, so an EventEmitter is enough.
 */
import { EventEmitter } from 'node:events'

const bus = new EventEmitter()
bus.setMaxListeners(0)

/** Tells every open stream of these users that their notices changed. */
export function announceNotices(userIds: readonly string[]): void {
  for (const userId of new Set(userIds)) bus.emit(`user:${userId}`)
}

/** Calls `listener` whenever the user's notices change; returns the unsubscribe function. */
export function onNoticesChanged(userId: string, listener: () => void): () => void {
  bus.on(`user:${userId}`, listener)
  return () => void bus.off(`user:${userId}`, listener)
}
