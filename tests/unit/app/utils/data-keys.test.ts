import { describe, expect, it } from 'vitest'
import { tankDataKeys, tankDataKeysFor, type TankDataPart } from '../../../../app/utils/data-keys'

describe('the keys of a tank\'s data', () => {
  it('give every part of one tank its own key, and no two tanks the same key', () => {
    const parts = Object.keys(tankDataKeys) as TankDataPart[]
    const keys = [...tankDataKeysFor('t-1', parts), ...tankDataKeysFor('t-2', parts)]
    expect(new Set(keys).size).toBe(parts.length * 2)
    expect(keys.every(key => key.includes('t-1') || key.includes('t-2'))).toBe(true)
  })

  it('name the same key for the reader and for the form that refreshes it', () => {
    expect(tankDataKeysFor('t-9', ['verdict', 'tank'])).toEqual([tankDataKeys.verdict('t-9'), tankDataKeys.tank('t-9')])
  })
})
