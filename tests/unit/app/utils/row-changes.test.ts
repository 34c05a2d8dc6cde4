/** The one way a row of a tank's history is changed, and how many pages the rows fill. */
import { ref } from 'vue'
import { describe, expect, it, vi } from 'vitest'
import { pageCount, rowChanger, type RowRequest } from '../../../../app/utils/row-changes'

function list(options: { fail?: unknown } = {}) {
  const sent: { rowId: string, request: RowRequest }[] = []
  const reload = vi.fn(async () => undefined)
  const onChanged = vi.fn()
  const message = ref('')
  const said: string[] = []
  const hidden = ref<ReadonlySet<string>>(new Set())
  // The undo window as the toast store opens it; the test closes it by hand.
  const windows: { done: string, commit: () => void, undo: () => void }[] = []
  const rows = rowChanger({
    send: async (rowId, request) => {
      sent.push({ rowId, request })
      if (options.fail) throw options.fail
    },
    reload,
    onChanged,
    message,
    say: done => said.push(done),
    offerUndo: (done, actions) => windows.push({ done, ...actions }),
    hidden,
  })
  return { rows, sent, reload, onChanged, message, said, hidden, windows }
}

describe('changing a row of a tank\'s history', () => {
  it('a change that goes through says so, reloads the rows and tells the page', async () => {
    const { rows, sent, reload, onChanged, message, said } = list()
    const ok = await rows.changeRow('ev-1', { method: 'PATCH', body: { notes: 'topped up' } }, 'Event corrected.', 'The event could not be saved.')
    expect(ok).toBe(true)
    expect(sent).toEqual([{ rowId: 'ev-1', request: { method: 'PATCH', body: { notes: 'topped up' } } }])
    expect(said).toEqual(['Event corrected.'])
    expect(message.value).toBe('')
    expect(reload).toHaveBeenCalledOnce()
    expect(onChanged).toHaveBeenCalledOnce()
  })

  it('a refused change says the server\'s words, and neither reloads nor tells the page', async () => {
    const { rows, reload, onChanged, message } = list({ fail: { data: { statusMessage: 'This reading was signed off and can no longer change.' } } })
    expect(await rows.changeRow('r-1', { method: 'PATCH', body: {} }, 'Reading corrected.', 'The reading could not be saved.')).toBe(false)
    expect(message.value).toBe('This reading was signed off and can no longer change.')
    expect(reload).not.toHaveBeenCalled()
    expect(onChanged).not.toHaveBeenCalled()
  })

  it('a failure without words from the server says the fallback', async () => {
    const { rows, message } = list({ fail: new Error('network down') })
    await rows.changeRow('r-1', { method: 'PATCH', body: {} }, 'Reading corrected.', 'The reading could not be saved.')
    expect(message.value).toBe('The reading could not be saved.')
  })

  it('a form that shows field messages gets the error itself', async () => {
    const failure = { data: { data: { issues: [{ field: 'pH', message: 'pH is between 0 and 14.' }] } } }
    const { rows, message } = list({ fail: failure })
    const seen: unknown[] = []
    await rows.changeRow('r-1', { method: 'PATCH', body: {} }, 'Reading corrected.', 'The correction could not be saved.', e => seen.push(e))
    expect(seen).toEqual([failure])
    expect(message.value).toBe('')
  })

  it('a deletion hides the row at once and sends nothing until the undo window closes', async () => {
    const { rows, sent, hidden, windows, reload, onChanged } = list()
    const deleted = rows.deleteRow('ev-9', 'Water change deleted.', 'The event could not be deleted.')
    expect([...hidden.value]).toEqual(['ev-9'])
    expect(windows.map(w => w.done)).toEqual(['Water change deleted.'])
    expect(sent).toEqual([])
    windows[0]!.commit()
    expect(await deleted).toBe(true)
    expect(sent).toEqual([{ rowId: 'ev-9', request: { method: 'DELETE' } }])
    expect(reload).toHaveBeenCalledOnce()
    expect(onChanged).toHaveBeenCalledOnce()
  })

  it('Undo brings the row back and sends nothing', async () => {
    const { rows, sent, hidden, windows, onChanged } = list()
    const deleted = rows.deleteRow('r-4', 'Test deleted.', 'The reading could not be deleted.')
    windows[0]!.undo()
    expect(await deleted).toBe(false)
    expect(hidden.value.size).toBe(0)
    expect(sent).toEqual([])
    expect(onChanged).not.toHaveBeenCalled()
  })

  it('a refused deletion brings the row back with the server\'s words', async () => {
    const { rows, hidden, windows, message, onChanged } = list({ fail: { data: { statusMessage: 'This reading was signed off and can no longer change.' } } })
    const deleted = rows.deleteRow('r-5', 'Test deleted.', 'The reading could not be deleted.')
    windows[0]!.commit()
    expect(await deleted).toBe(false)
    expect(hidden.value.size).toBe(0)
    expect(message.value).toBe('This reading was signed off and can no longer change.')
    expect(onChanged).not.toHaveBeenCalled()
  })
})

describe('page count', () => {
  it('is one page for no rows, and rounds a part page up', () => {
    expect(pageCount(0, 20)).toBe(1)
    expect(pageCount(20, 20)).toBe(1)
    expect(pageCount(21, 20)).toBe(2)
    expect(pageCount(45, 20)).toBe(3)
  })
})
