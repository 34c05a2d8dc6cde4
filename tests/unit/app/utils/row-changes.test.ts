/** The one way a row of a tank's history is changed, and how many pages the rows fill. */
import { ref } from 'vue'
import { describe, expect, it, vi } from 'vitest'
import { pageCount, rowChanger, type RowRequest } from '../../../../app/utils/row-changes'

function list(options: { fail?: unknown, confirm?: boolean } = {}) {
  const sent: { rowId: string, request: RowRequest }[] = []
  const reload = vi.fn(async () => undefined)
  const onChanged = vi.fn()
  const message = ref('')
  const rows = rowChanger({
    send: async (rowId, request) => {
      sent.push({ rowId, request })
      if (options.fail) throw options.fail
    },
    reload,
    onChanged,
    message,
    confirm: () => options.confirm ?? true,
  })
  return { rows, sent, reload, onChanged, message }
}

describe('changing a row of a tank\'s history', () => {
  it('a change that goes through says so, reloads the rows and tells the page', async () => {
    const { rows, sent, reload, onChanged, message } = list()
    const ok = await rows.changeRow('ev-1', { method: 'PATCH', body: { notes: 'topped up' } }, 'Event corrected.', 'The event could not be saved.')
    expect(ok).toBe(true)
    expect(sent).toEqual([{ rowId: 'ev-1', request: { method: 'PATCH', body: { notes: 'topped up' } } }])
    expect(message.value).toBe('Event corrected.')
    expect(reload).toHaveBeenCalledOnce()
    expect(onChanged).toHaveBeenCalledOnce()
  })

  it('a refused change says the server\'s words, and neither reloads nor tells the page', async () => {
    const { rows, reload, onChanged, message } = list({ fail: { data: { statusMessage: 'This reading was signed off and can no longer change.' } } })
    expect(await rows.changeRow('r-1', { method: 'DELETE' }, 'Reading deleted.', 'The reading could not be deleted.')).toBe(false)
    expect(message.value).toBe('This reading was signed off and can no longer change.')
    expect(reload).not.toHaveBeenCalled()
    expect(onChanged).not.toHaveBeenCalled()
  })

  it('a failure without words from the server says the fallback', async () => {
    const { rows, message } = list({ fail: new Error('network down') })
    await rows.changeRow('r-1', { method: 'DELETE' }, 'Reading deleted.', 'The reading could not be deleted.')
    expect(message.value).toBe('The reading could not be deleted.')
  })

  it('a form that shows field messages gets the error itself', async () => {
    const failure = { data: { data: { issues: [{ field: 'pH', message: 'pH is between 0 and 14.' }] } } }
    const { rows, message } = list({ fail: failure })
    const seen: unknown[] = []
    await rows.changeRow('r-1', { method: 'PATCH', body: {} }, 'Reading corrected.', 'The correction could not be saved.', e => seen.push(e))
    expect(seen).toEqual([failure])
    expect(message.value).toBe('')
  })

  it('deletes only once the person confirms', async () => {
    const declined = list({ confirm: false })
    await declined.rows.deleteRow('ev-9', 'Delete the water change?', 'Event deleted.', 'The event could not be deleted.')
    expect(declined.sent).toEqual([])
    const confirmed = list({ confirm: true })
    await confirmed.rows.deleteRow('ev-9', 'Delete the water change?', 'Event deleted.', 'The event could not be deleted.')
    expect(confirmed.sent).toEqual([{ rowId: 'ev-9', request: { method: 'DELETE' } }])
    expect(confirmed.message.value).toBe('Event deleted.')
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
