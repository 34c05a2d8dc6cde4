import { defineStore } from 'pinia'
import { ref } from 'vue'

/** The unread count an `unread` event of the notification stream carries, or null for a malformed event. */
export function unreadFromStreamEvent(data: string): number | null {
  try {
    return countOrNull((JSON.parse(data) as { unread?: unknown } | null)?.unread)
  }
  catch {
    return null
  }
}

function countOrNull(value: unknown): number | null {
  return typeof value === 'number' && Number.isInteger(value) && value >= 0 ? value : null
}

/**
 * The signed-in person's unread notices: one count for the header's bell, the notification
 * centre and every page that listens, set by whichever answer carries it last (the list, the
 * bell's fetch, a live stream event). `changes` counts stream events, so a page can reload its
 * own list when the server says something happened.
 */
export const useNoticesStore = defineStore('notices', () => {
  const unread = ref(0)
  const changes = ref(0)

  /** Takes a count from the server; anything that is not a count leaves the last one. */
  function setUnread(value: unknown): void {
    const count = countOrNull(value)
    if (count !== null) unread.value = count
  }

  /** A stream event arrived: take its count and let the listening pages know. */
  function receiveStreamEvent(data: string): void {
    const count = unreadFromStreamEvent(data)
    if (count === null) return
    unread.value = count
    changes.value++
  }

  /** Signing out forgets the count, so the next person does not see it for a moment. */
  function $reset(): void {
    unread.value = 0
    changes.value = 0
  }

  return { unread, changes, setUnread, receiveStreamEvent, $reset }
})
