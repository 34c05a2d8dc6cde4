/**
 * Ids for many rows written together (the CSV import's), in the order they are written. A
 * table's primary key is an index of its ids: random ids (version 4) go anywhere in it, so
 * 100,000 of them touched an index page for nearly every row, and the longer the table the
 * more of those pages had left the cache (the import's write lock grew with the table: see
 * bench/README.md). These sort after one another, so the index takes a batch at one place, as
 * an append.
 *
 * The layout is a version 7 UUID's (RFC 9562): the batch's time in ms (48 bits), the version,
 * 42 random bits drawn once per batch (two batches in the same ms differ), the variant, then
 * the row's number in the batch (32 bits). Any UUID check accepts them; a collision of two
 * batches would be refused by the primary key, never merged.
 */
import { randomBytes } from 'node:crypto'

/** Largest row number a batch's ids can carry. */
export const MAX_ORDERED_ID_SEQUENCE = 0xFFFFFFFF

const hex = (n: number, digits: number) => n.toString(16).padStart(digits, '0')

/** Ids of a batch made at `ms`: `idOf(n)` sorts after `idOf(m)` whenever n > m (0 <= n <= MAX_ORDERED_ID_SEQUENCE). */
export function orderedIds(ms: number): (n: number) => string {
  const random = randomBytes(6)
  const time = hex(ms, 12)
  // 12 random bits after the version, 2 + 12 after the variant, 16 before the row number: 42.
  const prefix = `${time.slice(0, 8)}-${time.slice(8)}-7${hex(random.readUInt16BE(0) & 0xFFF, 3)}-`
    + `${hex(0x8000 | (random.readUInt16BE(2) & 0x3FFF), 4)}-${hex(random.readUInt16BE(4), 4)}`
  return (n) => {
    if (!Number.isInteger(n) || n < 0 || n > MAX_ORDERED_ID_SEQUENCE) throw new RangeError(`an ordered id's row number must be 0 to ${MAX_ORDERED_ID_SEQUENCE}: ${n}`)
    return prefix + hex(n, 8)
  }
}
