/**
 * A stored text read once per distinct text: the same text gives the same (frozen) object, a
 * changed text is read again at once, and the memory is bounded.
 */
import { describe, expect, it } from 'vitest'
import { parsedOncePerText } from '../../../../server/db/parsed-text'

describe('parsedOncePerText', () => {
  it('reads each distinct text once and gives the same object for the same text', () => {
    const reads: string[] = []
    const read = parsedOncePerText((text) => { reads.push(text); return JSON.parse(text) as { n: number } }, 4)
    const first = read('{"n":1}')
    expect(read(String('{"n":') + '1}')).toBe(first)
    expect(reads).toEqual(['{"n":1}'])
  })

  it('reads a changed text again at once', () => {
    const read = parsedOncePerText(text => JSON.parse(text) as { n: number }, 4)
    expect(read('{"n":1}').n).toBe(1)
    expect(read('{"n":2}').n).toBe(2)
    expect(read('{"n":1}').n).toBe(1)
  })

  it('freezes what it keeps all the way down, so no reader can change what the next one gets', () => {
    const read = parsedOncePerText(text => JSON.parse(text) as { list: { n: number }[] }, 4)
    const kept = read('{"list":[{"n":1}]}')
    expect(() => { kept.list.push({ n: 2 }) }).toThrow(TypeError)
    expect(() => { kept.list[0]!.n = 5 }).toThrow(TypeError)
    expect(read('{"list":[{"n":1}]}').list).toEqual([{ n: 1 }])
  })

  it('keeps at most the bound, the oldest text going first', () => {
    const reads: string[] = []
    const read = parsedOncePerText((text) => { reads.push(text); return { text } }, 3)
    for (const text of ['a', 'b', 'c', 'd']) read(text)
    read('d')
    read('b')
    expect(reads).toEqual(['a', 'b', 'c', 'd'])
    read('a')
    expect(reads).toEqual(['a', 'b', 'c', 'd', 'a'])
  })
})
