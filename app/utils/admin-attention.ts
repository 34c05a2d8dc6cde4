import type { AdminAttention } from '#shared/types/people'
import { ROLE_LABELS } from '~/utils/roles'
import { STATUS_LABELS } from '~/utils/tank-labels'

/** A link to where a decision is made: a person found by a search, or a tank's page. */
type AttentionLink = string | { path: string, query: { q: string } }

/** One thing on the admin's to-do list: its link, then plain words, then a warning if there is one. */
export interface AttentionItem { id: string, name: string, to: AttentionLink, details: string[], warning?: string }

/** One group of the admin's to-do list; `caution` marks a group where something already goes wrong. */
export interface AttentionGroup { key: string, title: string, why?: string, caution: boolean, items: AttentionItem[] }

/**
 * The admin's to-do list as groups, in the order they show, leaving out the empty ones.
 * A person is found on the people page by the words the list shows beside their name.
 */
export function attentionGroups(data: AdminAttention): AttentionGroup[] {
  const groups: AttentionGroup[] = [
    {
      key: 'deactivated',
      title: 'Deactivated, still on tanks',
      why: 'Hand their tanks to someone who can sign in.',
      caution: true,
      items: data.deactivatedWithTanks.map(p => ({
        id: p.id, name: p.name, to: { path: '/people', query: { q: p.name } },
        details: [ROLE_LABELS[p.role], `${p.openTanks} open ${p.openTanks === 1 ? 'tank' : 'tanks'}`],
      })),
    },
    {
      key: 'unassigned',
      title: 'Tanks with no aquarist',
      why: 'Nobody is told when their tests go wrong.',
      caution: true,
      items: data.unassignedTanks.map(t => ({
        id: t.id, name: t.name, to: `/tanks/${t.id}`,
        details: [t.clientName, STATUS_LABELS[t.status as keyof typeof STATUS_LABELS] ?? t.status],
      })),
    },
    {
      key: 'invitations',
      title: 'Invitations not yet accepted',
      caution: false,
      items: data.pendingInvitations.map(p => ({
        id: p.id, name: p.name, to: { path: '/people', query: { q: p.email } },
        details: [ROLE_LABELS[p.role]],
        warning: p.expired ? 'link expired' : undefined,
      })),
    },
  ]
  return groups.filter(g => g.items.length)
}
