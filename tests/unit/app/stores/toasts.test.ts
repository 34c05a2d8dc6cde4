/** The toast list and the undo window of a deletion. */
import { createPinia, setActivePinia } from 'pinia'
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { TOAST_MS, UNDO_MS, useToastStore } from '../../../../app/stores/toasts'

beforeEach(() => {
  setActivePinia(createPinia())
  vi.useFakeTimers()
  // The store runs its timers only in a browser.
  vi.stubGlobal('window', {})
})
afterEach(() => {
  vi.useRealTimers()
  vi.unstubAllGlobals()
})

describe('toasts', () => {
  it('a saved line goes by itself', () => {
    const store = useToastStore()
    store.say('Client saved.')
    expect(store.toasts.map(t => t.message)).toEqual(['Client saved.'])
    vi.advanceTimersByTime(TOAST_MS)
    expect(store.toasts).toEqual([])
  })

  it('a deletion is committed once its window closes, not before', () => {
    const store = useToastStore()
    const commit = vi.fn()
    const undo = vi.fn()
    store.offerUndo('Test deleted.', { commit, undo })
    vi.advanceTimersByTime(UNDO_MS - 1)
    expect(commit).not.toHaveBeenCalled()
    vi.advanceTimersByTime(1)
    expect(commit).toHaveBeenCalledOnce()
    expect(undo).not.toHaveBeenCalled()
    expect(store.toasts).toEqual([])
  })

  it('Undo runs instead of the commit, and the commit never follows', () => {
    const store = useToastStore()
    const commit = vi.fn()
    const undo = vi.fn()
    store.offerUndo('Test deleted.', { commit, undo })
    store.toasts[0]!.undo!()
    vi.advanceTimersByTime(UNDO_MS * 2)
    expect(undo).toHaveBeenCalledOnce()
    expect(commit).not.toHaveBeenCalled()
    expect(store.toasts).toEqual([])
  })

  it('closing the toast is not Undo: the deletion goes at once, once', () => {
    const store = useToastStore()
    const commit = vi.fn()
    store.offerUndo('Test deleted.', { commit, undo: vi.fn() })
    store.dismiss(store.toasts[0]!.id)
    vi.advanceTimersByTime(UNDO_MS * 2)
    expect(commit).toHaveBeenCalledOnce()
  })
})
