/**
 * The paged rows of a tank's history: the stable key and query it asks for, and the one way a
 * row is changed (message, reload, tell the page; or the failure, to a form or as a message).
 * The Nuxt fetch helpers are stood in for; the row logic is what is under test.
 */
import { ref } from 'vue'
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { TANK_ROWS_PAGE_SIZE, useTankRows } from '../../../../app/composables/useTankRows'

interface FetchCall { url: string, key: string, query: Record<string, string> }
let fetchCalls: FetchCall[]
let refreshes: number
let sent: { url: string, init: unknown }[]
let failWith: unknown
let total: number

beforeEach(() => {
  fetchCalls = []
  refreshes = 0
  sent = []
  failWith = undefined
  total = 45
  vi.stubGlobal('useFetch', (url: () => string, options: { key: () => string, query: { value: Record<string, string> } }) => {
    fetchCalls.push({ url: url(), key: options.key(), query: options.query.value })
    return Promise.resolve({ data: ref({ total, items: [] }), error: ref(null), refresh: async () => { refreshes++ } })
  })
  vi.stubGlobal('$fetch', async (url: string, init: unknown) => {
    sent.push({ url, init })
    if (failWith) throw failWith
  })
  vi.stubGlobal('window', { confirm: () => true })
})
afterEach(() => { vi.unstubAllGlobals() })

describe('useTankRows', () => {
  it('asks for the newest page first under the tank\'s stable key, and counts the pages', async () => {
    const rows = await useTankRows('readings', 'tank-1', 'takenAt', () => undefined)
    expect(fetchCalls).toEqual([{
      url: '/api/tanks/tank-1/readings',
      key: 'readings-tank-1',
      query: { page: '1', pageSize: String(TANK_ROWS_PAGE_SIZE), sort: 'takenAt', dir: 'desc' },
    }])
    expect(rows.pages.value).toBe(Math.ceil(45 / TANK_ROWS_PAGE_SIZE))
  })

  it('shows one page when there are no rows', async () => {
    total = 0
    const rows = await useTankRows('events', 'tank-1', 'at', () => undefined)
    expect(rows.pages.value).toBe(1)
  })

  it('a change that goes through says so, reloads the rows and tells the page', async () => {
    const changed = vi.fn()
    const rows = await useTankRows('events', 'tank-2', 'at', changed)
    const ok = await rows.changeRow('ev-1', { method: 'PATCH', body: { notes: 'topped up' } }, 'Event corrected.', 'The event could not be saved.')
    expect(ok).toBe(true)
    expect(sent).toEqual([{ url: '/api/tanks/tank-2/events/ev-1', init: { method: 'PATCH', body: { notes: 'topped up' } } }])
    expect(rows.message.value).toBe('Event corrected.')
    expect(refreshes).toBe(1)
    expect(changed).toHaveBeenCalledOnce()
  })

  it('a refused change says the server\'s words, or the fallback, and changes nothing on the page', async () => {
    const changed = vi.fn()
    const rows = await useTankRows('readings', 'tank-3', 'takenAt', changed)
    failWith = { data: { statusMessage: 'This reading was signed off and can no longer change.' } }
    expect(await rows.changeRow('r-1', { method: 'DELETE' }, 'Reading deleted.', 'The reading could not be deleted.')).toBe(false)
    expect(rows.message.value).toBe('This reading was signed off and can no longer change.')
    failWith = new Error('network down')
    await rows.changeRow('r-1', { method: 'DELETE' }, 'Reading deleted.', 'The reading could not be deleted.')
    expect(rows.message.value).toBe('The reading could not be deleted.')
    expect(refreshes).toBe(0)
    expect(changed).not.toHaveBeenCalled()
  })

  it('a form that shows field messages gets the error itself', async () => {
    const rows = await useTankRows('readings', 'tank-3', 'takenAt', () => undefined)
    failWith = { data: { data: { issues: [{ field: 'pH', message: 'pH is between 0 and 14.' }] } } }
    const seen: unknown[] = []
    await rows.changeRow('r-1', { method: 'PATCH', body: {} }, 'Reading corrected.', 'The correction could not be saved.', e => seen.push(e))
    expect(seen).toEqual([failWith])
    expect(rows.message.value).toBe('')
  })

  it('deletes only once the person confirms', async () => {
    const rows = await useTankRows('events', 'tank-4', 'at', () => undefined)
    vi.stubGlobal('window', { confirm: () => false })
    await rows.deleteRow('ev-9', 'Delete the water change?', 'Event deleted.', 'The event could not be deleted.')
    expect(sent).toEqual([])
    vi.stubGlobal('window', { confirm: () => true })
    await rows.deleteRow('ev-9', 'Delete the water change?', 'Event deleted.', 'The event could not be deleted.')
    expect(sent).toEqual([{ url: '/api/tanks/tank-4/events/ev-9', init: { method: 'DELETE' } }])
    expect(rows.message.value).toBe('Event deleted.')
  })
})
