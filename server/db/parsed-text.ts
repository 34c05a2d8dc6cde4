/**
 * A stored JSON text read once per distinct text: rows read on every request (a company's
 * settings, a tank's verdict) reuse what their text was read into, though the row itself is
 * read each time.
 *
 * Why this cannot serve an old answer: the key is the stored text itself, and callers read the
 * row every time, so a changed row is a new text and is read at once. What is kept is frozen all
 * the way down, since every reader of the same text gets the same object. Framework-free; one
 * memory per use and per process (the server and each worker thread).
 */

/** Freezes an object and every object under it. */
function deepFreeze<T>(value: T): T {
  if (typeof value === 'object' && value !== null && !Object.isFrozen(value)) {
    Object.freeze(value)
    for (const inner of Object.values(value)) deepFreeze(inner)
  }
  return value
}

/**
 * `read` applied once per distinct text, its result frozen and shared; at most `kept` texts
 * are remembered (this bounds memory), the oldest going first.
 */
export function parsedOncePerText<T>(read: (text: string) => T, kept: number): (text: string) => T {
  const known = new Map<string, T>()
  return (text) => {
    const found = known.get(text)
    if (found !== undefined) return found
    const value = deepFreeze(read(text))
    // Maps keep insertion order, so the first key is the oldest entry.
    if (known.size >= kept) known.delete(known.keys().next().value!)
    known.set(text, value)
    return value
  }
}
