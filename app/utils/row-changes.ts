import type { Ref } from 'vue'
import { apiErrorMessage } from '~/utils/api-error'

/** A change to one row of a tank's history: a correction (PATCH) or a deletion. */
export interface RowRequest { method: 'PATCH' | 'DELETE', body?: Record<string, unknown> }

/** What a row change needs from its list: how to send, how to reload, whom to tell, where to say it. */
export interface RowChangeDeps {
  send: (rowId: string, request: RowRequest) => Promise<unknown>
  reload: () => Promise<unknown>
  onChanged: () => void
  message: Ref<string>
  confirm: (question: string) => boolean
}

/** How many pages `total` rows fill; one page when there are none. */
export function pageCount(total: number, pageSize: number): number {
  return Math.max(1, Math.ceil(total / pageSize))
}

/**
 * The one way a history row is changed: send the change, say what happened, reload the rows
 * and tell the page (its verdict and chart follow). A failure goes to `onError` when given (a
 * form that shows field messages), else `message` says the server's words or `failure`.
 */
export function rowChanger(deps: RowChangeDeps) {
  async function changeRow(rowId: string, request: RowRequest, done: string, failure: string, onError?: (error: unknown) => void): Promise<boolean> {
    try {
      await deps.send(rowId, request)
    }
    catch (e) {
      if (onError) onError(e)
      else deps.message.value = apiErrorMessage(e, failure)
      return false
    }
    deps.message.value = done
    await deps.reload()
    deps.onChanged()
    return true
  }

  /** Deletes one row once the person confirms `question`. */
  async function deleteRow(rowId: string, question: string, done: string, failure: string): Promise<void> {
    if (!deps.confirm(question)) return
    await changeRow(rowId, { method: 'DELETE' }, done, failure)
  }

  return { changeRow, deleteRow }
}
