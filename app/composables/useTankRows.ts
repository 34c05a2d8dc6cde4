import { tankDataKeys } from '~/utils/data-keys'
import { pageCount, rowChanger } from '~/utils/row-changes'
import { useToastStore } from '~/stores/toasts'

/** The row type of a history list. */
type RowOf<List> = List extends { items: readonly (infer Row)[] } ? Row : never

/** Rows a page of a tank's history shows at once. */
export const TANK_ROWS_PAGE_SIZE = 20

/**
 * One page of a tank's tests or events (GET /api/tanks/:id/readings|events) under its stable key,
 * newest first, with the one way a row is corrected or deleted (`utils/row-changes.ts`); a change
 * reloads the rows and tells the tank page (`onChanged`) so its verdict and chart follow.
 * `items` leaves out rows deleted on screen whose undo window is still open.
 */
export async function useTankRows<List extends { total: number }>(
  resource: 'readings' | 'events',
  tankId: MaybeRefOrGetter<string>,
  defaultSort: string,
  onChanged: () => void,
) {
  const page = ref(1)
  const sort = ref(defaultSort)
  const dir = ref<'asc' | 'desc'>('desc')
  const query = computed(() => ({ page: String(page.value), pageSize: String(TANK_ROWS_PAGE_SIZE), sort: sort.value, dir: dir.value }))
  const { data, error, refresh } = await useFetch<List>(() => `/api/tanks/${toValue(tankId)}/${resource}`, {
    key: () => tankDataKeys[resource](toValue(tankId)),
    query,
  })
  // useFetch's picked-data type does not narrow inside a generic function; the list shape is known.
  const pages = computed(() => pageCount((data.value as { total?: number } | null | undefined)?.total ?? 0, TANK_ROWS_PAGE_SIZE))
  /** What the last change did, or why it failed. */
  const message = ref('')
  const hidden = ref<ReadonlySet<string>>(new Set())
  const toasts = useToastStore()
  const items = computed(() => {
    const rows = (data.value as { items?: (RowOf<List> & { id: string })[] } | null | undefined)?.items ?? []
    return rows.filter(row => !hidden.value.has(row.id))
  })
  const { changeRow, deleteRow } = rowChanger({
    send: async (rowId, request) => {
      const url: string = `/api/tanks/${toValue(tankId)}/${resource}/${rowId}`
      if (request.method === 'DELETE') await $fetch(url, { method: 'DELETE' })
      else await $fetch(url, { method: 'PATCH', body: request.body })
    },
    reload: refresh,
    onChanged,
    message,
    say: done => toasts.say(done),
    offerUndo: (done, actions) => toasts.offerUndo(done, actions),
    hidden,
  })

  /** What `TankRowsFrame` says around the rows: the last change's words, whether there are none, how many pages. */
  const frame = computed(() => ({ message: message.value, empty: !!data.value && !items.value.length, pages: pages.value }))

  return { page, sort, dir, data, items, error, refresh, pages, message, frame, changeRow, deleteRow }
}
