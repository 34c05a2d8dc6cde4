/**
 * fast-check arbitraries for hostile request bodies: wrong types, huge and unicode
 * strings, deep nesting, prototype-pollution keys, NaN/Infinity spelled as strings,
 * dates far in the past and future. Bodies are produced as JSON text so keys such as
 * `__proto__` reach the server as written.
 */
import fc from 'fast-check'

/** Strings that have broken parsers, validators and queries elsewhere. */
export const NASTY_STRINGS = [
  '', ' ', '\u0000', '\t\n\r', 'NaN', 'Infinity', '-Infinity', '1e309', '-0', '0x1F', '1_000', '١٢٣',
  'null', 'undefined', 'true', '[]', '{}', '<script>alert(1)</script>', '\'; drop table tanks; --',
  '../../../../etc/passwd', '..\\..\\windows\\win.ini', '%00', '\u202Egnp.exe', '🐠🪸🦐', 'Z\u0351\u0362a\u035Bl\u0360go',
  '0000-00-00', '0001-01-01T00:00:00Z', '1900-02-29', '9999-12-31T23:59:59Z', '-271821-04-20T00:00:00.000Z',
  '+275760-09-13T00:00:00.000Z', '2026-13-45T25:61:61Z', '1970-01-01T00:00:00+99:00', 'yesterday',
]

/** A marker long enough to be searched for in responses (they must never echo input). */
export const ECHO_MARKER = 'tidewright-fuzz-echo-marker'

const hugeString = fc.integer({ min: 20_000, max: 300_000 }).map(n => ECHO_MARKER + 'x'.repeat(n))

function nested(depth: number, kind: 'array' | 'object'): string {
  return kind === 'array' ? '['.repeat(depth) + ']'.repeat(depth) : '{"a":'.repeat(depth) + '1' + '}'.repeat(depth)
}

/** One hostile JSON value, as JSON text. */
export const hostileValueText: fc.Arbitrary<string> = fc.oneof(
  fc.constantFrom(...NASTY_STRINGS).map(s => JSON.stringify(s)),
  fc.string({ unit: 'grapheme', maxLength: 40 }).map(s => JSON.stringify(s)),
  fc.string({ unit: 'binary', maxLength: 40 }).map(s => JSON.stringify(s)),
  hugeString.map(s => JSON.stringify(s)),
  fc.oneof(fc.integer(), fc.double({ noNaN: true, noDefaultInfinity: true }), fc.constantFrom(1e308, -1e308, 5e-324, 2 ** 53 + 1, -1)).map(n => JSON.stringify(n)),
  fc.constantFrom('1e400', '-1e400', '0.' + '0'.repeat(400) + '1', '123456789012345678901234567890'),
  fc.constantFrom('true', 'false', 'null', '[]', '{}', '[null]', '[1,"a",{}]'),
  fc.constantFrom('{"__proto__":{"polluted":true}}', '{"constructor":{"prototype":{"polluted":true}}}', '{"prototype":{"polluted":true}}'),
  fc.tuple(fc.integer({ min: 50, max: 20_000 }), fc.constantFrom('array' as const, 'object' as const)).map(([d, k]) => nested(d, k)),
  fc.jsonValue({ maxDepth: 4 }).map(v => JSON.stringify(v)),
)

/** A JSON object text from key/value-text pairs (keys written as given, so `__proto__` stays a key). */
export function objectText(pairs: [string, string][]): string {
  return `{${pairs.map(([k, v]) => `${JSON.stringify(k)}:${v}`).join(',')}}`
}

/** Hostile bodies built around a valid one: a field replaced, dropped, renamed, or poisoned keys added. */
export function hostileBodies(valid: Record<string, unknown>): fc.Arbitrary<string> {
  const keys = Object.keys(valid)
  const validPairs = (): [string, string][] => keys.map(k => [k, JSON.stringify(valid[k])])
  const replaceOne = fc.tuple(fc.constantFrom(...keys), hostileValueText).map(([key, value]) =>
    objectText(validPairs().map(([k, v]) => [k, k === key ? value : v])))
  const replaceMany = fc.array(fc.tuple(fc.constantFrom(...keys), hostileValueText), { minLength: 2, maxLength: 4 }).map((edits) => {
    const map = new Map(validPairs())
    for (const [k, v] of edits) map.set(k, v)
    return objectText([...map])
  })
  const dropOne = fc.constantFrom(...keys).map(key => objectText(validPairs().filter(([k]) => k !== key)))
  const poisoned = fc.tuple(fc.constantFrom('__proto__', 'constructor', 'prototype', '__defineGetter__', 'toString', 'hasOwnProperty'), hostileValueText)
    .map(([key, value]) => objectText([...validPairs(), [key, value]]))
  const whole = fc.oneof(
    hostileValueText,
    fc.constantFrom('', '{', '{"a":', 'not json', '\u0000', '{"a":1}{"b":2}', '{\'single\':\'quotes\'}', '{"a":NaN}', '{"a":Infinity}', '{"a":undefined}'),
  )
  return keys.length ? fc.oneof(replaceOne, replaceMany, dropOne, poisoned, whole) : whole
}
