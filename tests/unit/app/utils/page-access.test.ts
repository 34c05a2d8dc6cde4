import { describe, expect, it } from 'vitest'
import { allowsRole } from '../../../../app/utils/page-access'

describe('allowsRole', () => {
  it('lets every signed-in role into a page that names no roles', () => {
    expect(allowsRole(undefined, 'client')).toBe(true)
  })
  it('lets in only the roles a page names', () => {
    expect(allowsRole(['admin', 'aquarist'], 'aquarist')).toBe(true)
    expect(allowsRole(['admin', 'aquarist'], 'supervisor')).toBe(false)
    expect(allowsRole(['admin'], undefined)).toBe(false)
  })
})
