import { defineStore } from 'pinia'
import { ref } from 'vue'

/** How long a plain toast stays up. */
export const TOAST_MS = 4000
/** How long a deletion can be taken back before it is sent (common practice, no published source). */
export const UNDO_MS = 6000

export interface Toast {
  id: number
  message: string
  tone: 'done' | 'failed'
  /** Shown as an "Undo" button while the toast is up. */
  undo?: () => void
}

/**
 * The short lines that say a create, save or delete went through (one list for the whole app,
 * shown by `<AppToasts>` in the layouts). A toast with `undo` is the undo window of a deletion:
 * `commit` runs when the window closes unless Undo was pressed first, so nothing is deleted on
 * the server until the person has had the chance to take it back.
 */
export const useToastStore = defineStore('toasts', () => {
  const toasts = ref<Toast[]>([])
  const timers = new Map<number, ReturnType<typeof setTimeout>>()
  /** What closing a toast sets going (a deletion's commit), run once whether it times out or is closed. */
  const onClose = new Map<number, () => void>()
  let next = 1

  /** Takes a toast down; a pending deletion is sent now (closing is not Undo). */
  function dismiss(id: number): void {
    clearTimeout(timers.get(id))
    timers.delete(id)
    toasts.value = toasts.value.filter(t => t.id !== id)
    const close = onClose.get(id)
    onClose.delete(id)
    close?.()
  }

  function add(toast: Omit<Toast, 'id'>, ms: number, close?: () => void): number {
    const id = next++
    toasts.value = [...toasts.value, { ...toast, id }]
    if (close) onClose.set(id, close)
    // Toasts follow a person's action, so they only ever run in the browser; no timer on the server.
    if (typeof window !== 'undefined') timers.set(id, setTimeout(() => dismiss(id), ms))
    return id
  }

  /** Says that something went through (or, with `failed`, did not). */
  function say(message: string, tone: Toast['tone'] = 'done'): number {
    return add({ message, tone }, TOAST_MS)
  }

  /**
   * Offers to take an action back: `commit` runs once the window closes, `undo` instead when
   * the person presses Undo first.
   */
  function offerUndo(message: string, actions: { commit: () => void, undo: () => void }, ms = UNDO_MS): number {
    const id = add({
      message,
      tone: 'done',
      undo: () => {
        onClose.delete(id)
        dismiss(id)
        actions.undo()
      },
    }, ms, actions.commit)
    return id
  }

  return { toasts, say, offerUndo, dismiss }
})
