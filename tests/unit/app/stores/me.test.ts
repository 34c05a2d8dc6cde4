import { createPinia, setActivePinia } from 'pinia'
import { beforeEach, describe, expect, it } from 'vitest'
import { useMeStore, type SignedInPerson } from '../../../../app/stores/me'
import type { Role } from '../../../../shared/vocabulary'

const person = (role: Role, extra: Partial<SignedInPerson> = {}): SignedInPerson => ({ id: 'p1', name: 'Rin', role, units: 'us', timeZone: 'America/Chicago', ...extra })

describe('the signed-in person store', () => {
  beforeEach(() => setActivePinia(createPinia()))

  it('signed out: nobody, no role, metric units, no rights', () => {
    const me = useMeStore()
    expect(me.signedIn).toBe(false)
    expect(me.units).toBe('metric')
    expect([me.isStaff, me.isClient, me.managesTanks, me.entersTests]).toEqual([false, false, false, false])
  })

  it('names what each role may do in the interface', () => {
    const me = useMeStore()
    const rights = (role: Role) => {
      me.setPerson(person(role))
      return { staff: me.isStaff, client: me.isClient, admin: me.isAdmin, manages: me.managesTanks, enters: me.entersTests }
    }
    expect(rights('admin')).toEqual({ staff: true, client: false, admin: true, manages: true, enters: true })
    expect(rights('aquarist')).toEqual({ staff: true, client: false, admin: false, manages: true, enters: true })
    expect(rights('supervisor')).toEqual({ staff: true, client: false, admin: false, manages: false, enters: false })
    expect(rights('client')).toEqual({ staff: false, client: true, admin: false, manages: false, enters: true })
  })

  it('keeps the person\'s units and takes a saved change at once', () => {
    const me = useMeStore()
    me.setPerson(person('client'))
    expect(me.units).toBe('us')
    me.setUnits('metric')
    expect(me.units).toBe('metric')
  })

  it('keeps only what the interface uses of the session, and forgets the person on sign-out', () => {
    const me = useMeStore()
    me.setPerson({ ...person('aquarist'), organisationId: 'org-1' } as SignedInPerson)
    expect(me.person).toEqual(person('aquarist'))
    me.setPerson(null)
    expect(me.signedIn).toBe(false)
    me.setPerson(person('admin'))
    me.$reset()
    expect(me.person).toBeNull()
  })
})

describe('the voice a verdict speaks in', () => {
  beforeEach(() => setActivePinia(createPinia()))

  it('a client reads plain words and cannot switch to canonical units; staff read kit units and may switch', () => {
    const me = useMeStore()
    me.setPerson(person('client'))
    me.showCanonicalUnits(true)
    expect([me.voice, me.canonicalUnits]).toEqual(['client', false])
    me.setPerson(person('supervisor'))
    expect(me.voice).toBe('canonical')
    me.showCanonicalUnits(false)
    expect([me.voice, me.canonicalUnits]).toEqual(['staff', false])
    me.showCanonicalUnits(true)
    me.$reset()
    me.setPerson(person('aquarist'))
    expect(me.voice).toBe('staff')
  })
})
