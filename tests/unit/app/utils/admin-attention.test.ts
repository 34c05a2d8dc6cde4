import { describe, expect, it } from 'vitest'
import type { AdminAttention } from '#shared/types/people'
import { attentionGroups } from '~/utils/admin-attention'

const NONE: AdminAttention = { pendingInvitations: [], deactivatedWithTanks: [], unassignedTanks: [] }

describe('attentionGroups', () => {
  it('leaves out every empty group, so nothing to do is an empty list', () => {
    expect(attentionGroups(NONE)).toEqual([])
  })

  it('keeps the order deactivated, unassigned, invitations, and edges only the first two in caution', () => {
    const groups = attentionGroups({
      deactivatedWithTanks: [{ id: 'p1', name: 'Ada Reef', role: 'aquarist', openTanks: 2 }],
      unassignedTanks: [{ id: 't1', name: 'Lagoon 300', clientName: 'Marsh & Co', status: 'cycling' }],
      pendingInvitations: [{ id: 'p2', name: 'Ben Kelp', email: 'ben@example.test', role: 'client', expired: false, invitedAt: null }],
    })
    expect(groups.map(g => [g.key, g.caution])).toEqual([['deactivated', true], ['unassigned', true], ['invitations', false]])
  })

  it('links a deactivated person to the people page by name, with their role and open tanks counted', () => {
    const [group] = attentionGroups({ ...NONE, deactivatedWithTanks: [{ id: 'p1', name: 'Ada Reef', role: 'aquarist', openTanks: 1 }] })
    expect(group?.items).toEqual([{ id: 'p1', name: 'Ada Reef', to: { path: '/people', query: { q: 'Ada Reef' } }, details: ['Aquarist', '1 open tank'] }])
  })

  it('links an unassigned tank to its page with its client and status in words, an unknown status as sent', () => {
    const [group] = attentionGroups({ ...NONE, unassignedTanks: [
      { id: 't1', name: 'Lagoon 300', clientName: 'Marsh & Co', status: 'cycling' },
      { id: 't2', name: 'Nano 60', clientName: 'Pier Cafe', status: 'archived' },
    ] })
    expect(group?.items.map(i => [i.to, i.details])).toEqual([['/tanks/t1', ['Marsh & Co', 'Cycling']], ['/tanks/t2', ['Pier Cafe', 'archived']]])
  })

  it('finds an invitation by its e-mail and warns only when its link expired', () => {
    const [group] = attentionGroups({ ...NONE, pendingInvitations: [
      { id: 'p2', name: 'Ben Kelp', email: 'ben@example.test', role: 'client', expired: true, invitedAt: null },
      { id: 'p3', name: 'Cy Coral', email: 'cy@example.test', role: 'client', expired: false, invitedAt: null },
    ] })
    expect(group?.items.map(i => [i.to, i.warning])).toEqual([[{ path: '/people', query: { q: 'ben@example.test' } }, 'link expired'], [{ path: '/people', query: { q: 'cy@example.test' } }, undefined]])
  })
})
