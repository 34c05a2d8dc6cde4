import { computed, ref, toValue, type MaybeRefOrGetter } from 'vue'
import { tankDataKeys } from '~/utils/data-keys'
import { apiErrorMessage } from '~/utils/api-error'

/** Rows a page of a tank's history shows at once. */
export const TANK_ROWS_PAGE_SIZE = 20

/**
 * One page of a tank's tests or events (GET /api/tanks/:id/readings|events) under its stable key,
 * newest first, with the one way a row is corrected or deleted: send the change, say what
 * happened, reload the page of rows and tell the tank page (`onChanged`) so its verdict and
 * chart follow.
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
  const total = computed(() => (data.value as { total?: number } | null | undefined)?.total ?? 0)
  const pages = computed(() => Math.max(1, Math.ceil(total.value / TANK_ROWS_PAGE_SIZE)))
  /** What the last change did, or why it failed. */
  const message = ref('')

  /**
   * Sends a change to one row. On success `message` says `done`; on failure `onError` gets the
   * error when given (a form that shows field messages), else `message` says `failure`.
   */
  async function changeRow(rowId: string, request: { method: 'PATCH' | 'DELETE', body?: Record<string, unknown> }, done: string, failure: string, onError?: (error: unknown) => void): Promise<boolean> {
    try {
      await $fetch(`/api/tanks/${toValue(tankId)}/${resource}/${rowId}`, request)
    }
    catch (e) {
      if (onError) onError(e)
      else message.value = apiErrorMessage(e, failure)
      return false
    }
    message.value = done
    await refresh()
    onChanged()
    return true
  }

  /** Deletes one row once the person confirms `question`. */
  async function deleteRow(rowId: string, question: string, done: string, failure: string): Promise<void> {
    if (!window.confirm(question)) return
    await changeRow(rowId, { method: 'DELETE' }, done, failure)
  }

  return { page, sort, dir, data, error, refresh, pages, message, changeRow, deleteRow }
}
