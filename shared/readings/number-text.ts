/**
 * A number's shortest text (String(value), which is also how JSON writes a finite number),
 * remembered. A CSV import writes each test's values twice (its import key and the JSON of what
 * was typed): 600,000 numbers for 100,000 tests, where a log's values repeat (a kit reads in
 * steps, a probe to a tenth), and converting each one again took about 100 ms of such an import.
 * The text depends on the number alone (0 and -0 both read "0"), so a remembered one is the answer.
 */

/** How many texts are remembered before the memory starts afresh (well under a MB). */
const KEPT = 4096
const texts = new Map<number, string>()

export function numberText(value: number): string {
  let text = texts.get(value)
  if (text === undefined) {
    text = String(value)
    if (texts.size >= KEPT) texts.clear()
    texts.set(value, text)
  }
  return text
}
