import { describe, expect, it } from 'vitest'
import { pickerCutNote, pickerOptions } from '../../../../app/utils/picker-options'

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
