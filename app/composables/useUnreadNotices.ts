import type { NotificationList } from '#shared/types/alerts'

/**
 * The user's notification centre, with an unread count that the server pushes live over
 * server-sent events (GET /api/notifications/stream). One stream per tab, shared by
 * whoever uses the composable.
 */
export function useUnreadNotices() {
  const unread = useState<number>('notices-unread', () => 0)
  return { unread }
}

let source: EventSource | null = null
let users = 0

/** Opens the live stream in the browser while at least one component needs it. */
export function useNoticeStream(onChange?: () => void) {
  const { unread } = useUnreadNotices()
  const listeners = useState<number>('notices-version', () => 0)
  onMounted(() => {
    users++
    if (!source) {
      source = new EventSource('/api/notifications/stream')
      source.addEventListener('unread', (message) => {
        try {
          unread.value = Number(JSON.parse((message as MessageEvent<string>).data).unread) || 0
          listeners.value++
        }
        catch { /* a malformed event changes nothing */ }
      })
    }
  })
  onBeforeUnmount(() => {
    users--
    if (users <= 0 && source) {
      source.close()
      source = null
    }
  })
  if (onChange) watch(listeners, () => onChange())
  return { unread }
}

/** Reads the notification list (SSR-friendly) and keeps the shared unread count in step. */
export async function useNotificationList() {
  const { unread } = useUnreadNotices()
  const result = await useFetch<NotificationList>('/api/notifications', { key: 'notifications', headers: useRequestHeaders(['cookie']) })
  watch(() => result.data.value?.unread, (value) => {
    if (value !== undefined) unread.value = value
  }, { immediate: true })
  return result
}
