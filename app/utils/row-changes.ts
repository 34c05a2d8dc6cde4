import type { Ref } from 'vue'
import { apiErrorMessage } from '~/utils/api-error'

/** A change to one row of a tank's history: a correction (PATCH) or a deletion. */
export interface RowRequest { method: 'PATCH' | 'DELETE', body?: Record<string, unknown> }

/** What a row change needs from its list: how to send, how to reload, whom to tell, where to say it. */
export interface RowChangeDeps {
  send: (rowId: string, request: RowRequest) => Promise<unknown>
  reload: () => Promise<unknown>
  onChanged: () => void
  /** Where a failure is said, beside the list. */
  message: Ref<string>
  /** Says that a change went through (a toast). */
  say: (done: string) => void
  /** Opens the undo window of a deletion (a toast with Undo): `commit` when it closes, `undo` if pressed first. */
  offerUndo: (done: string, actions: { commit: () => void, undo: () => void }) => void
  /** Rows deleted on screen whose DELETE waits for the undo window to close. */
  hidden: Ref<ReadonlySet<string>>
}

/** How many pages `total` rows fill; one page when there are none. */
export function pageCount(total: number, pageSize: number): number {
  return Math.max(1, Math.ceil(total / pageSize))
}

/**
 * The one way a history row is changed: send the change, say what happened (a toast), reload
 * the rows and tell the page (its verdict and chart follow). A failure goes to `onError` when
 * given (a form that shows field messages), else `message` says the server's words or `failure`.
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
    deps.message.value = ''
    deps.say(done)
    await deps.reload()
    deps.onChanged()
    return true
  }

  const setHidden = (rowId: string, hide: boolean) => {
    const next = new Set(deps.hidden.value)
    if (hide) next.add(rowId)
    else next.delete(rowId)
    deps.hidden.value = next
  }

  /**
   * Deletes one row the honest way round: it leaves the list at once with an Undo toast, and the
   * DELETE is sent only when the undo window closes. Undo (or a tab closed in the meantime)
   * sends nothing, so nothing has to be re-created and no row can be lost; a refused DELETE
   * brings the row back with the server's words.
   */
  function deleteRow(rowId: string, done: string, failure: string): Promise<boolean> {
    deps.message.value = ''
    setHidden(rowId, true)
    return new Promise((resolve) => {
      deps.offerUndo(done, {
        undo: () => {
          setHidden(rowId, false)
          resolve(false)
        },
        commit: () => {
          void sendDelete(rowId, failure).then(resolve)
        },
      })
    })
  }

  async function sendDelete(rowId: string, failure: string): Promise<boolean> {
    try {
      await deps.send(rowId, { method: 'DELETE' })
    }
    catch (e) {
      setHidden(rowId, false)
      deps.message.value = apiErrorMessage(e, failure)
      return false
    }
    await deps.reload()
    setHidden(rowId, false)
    deps.onChanged()
    return true
  }

  return { changeRow, deleteRow }
}
