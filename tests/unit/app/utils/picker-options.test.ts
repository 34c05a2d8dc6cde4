import { describe, expect, it } from 'vitest'
import { existsSync } from 'node:fs'
import { PICKER_LISTS, pickerCutNote, pickerOptions } from '../../../../app/utils/picker-options'

const ada = { id: 'a', name: 'Ada' }
const bo = { id: 'b', name: 'Bo' }

describe('a searchable picker', () => {
  it('keeps the chosen entry on the list when a search leaves it out', () => {
    expect(pickerOptions([bo], ada)).toEqual([ada, bo])
    expect(pickerOptions([ada, bo], ada)).toEqual([ada, bo])
    expect(pickerOptions([bo], null)).toEqual([bo])
  })

  it('says how many the server holds when it shows fewer, and nothing when it shows all', () => {
    expect(pickerCutNote(50, 312, 'clients')).toBe('Showing 50 of 312 clients. Type in the search box to find the others.')
    expect(pickerCutNote(12, 12, 'clients')).toBeNull()
  })
})

describe('the lists a picker field can pick from', () => {
  it('name a server list route and its one-entry route for each, and the noun its notes use', () => {
    for (const [list, { endpoint, noun }] of Object.entries(PICKER_LISTS)) {
      expect(endpoint).toBe(`/api/${list}`)
      expect(existsSync(`server${endpoint}/index.get.ts`)).toBe(true)
      expect(existsSync(`server${endpoint}/[id].get.ts`)).toBe(true)
      expect(pickerCutNote(50, 51, noun)).toContain(`51 ${list}`)
    }
  })
})
