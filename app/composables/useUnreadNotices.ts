import { storeToRefs } from 'pinia'
import type { NotificationList } from '#shared/types/alerts'
import { useNoticesStore } from '~/stores/notices'

let source: EventSource | null = null
let users = 0

/**
 * Opens the live notification stream (GET /api/notifications/stream) in the browser while at
 * least one component needs it: one stream per tab, feeding the notices store. `onChange`
 * runs whenever the server reports a change.
 */
export function useNoticeStream(onChange?: () => void) {
  const notices = useNoticesStore()
  onMounted(() => {
    users++
    if (!source) {
      source = new EventSource('/api/notifications/stream')
      source.addEventListener('unread', message => notices.receiveStreamEvent((message as MessageEvent<string>).data))
    }
  })
  onBeforeUnmount(() => {
    users--
    if (users <= 0 && source) {
      source.close()
      source = null
    }
  })
  if (onChange) watch(() => notices.changes, () => onChange())
  return storeToRefs(notices)
}

/** Reads the notification list (SSR-friendly) and keeps the store's unread count in step. */
export async function useNotificationList() {
  const notices = useNoticesStore()
  const result = await useFetch<NotificationList>('/api/notifications', { key: 'notifications' })
  watch(() => result.data.value?.unread, value => notices.setUnread(value), { immediate: true })
  return result
}
