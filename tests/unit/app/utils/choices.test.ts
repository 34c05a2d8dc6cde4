import { describe, expect, it } from 'vitest'
import { choicesWithBlank, kitBasisChoices, labelledChoices, plainChoices } from '../../../../app/utils/choices'
import { AMMONIA_BASES, EVENT_KINDS } from '../../../../shared/vocabulary'
import { EVENT_LABELS } from '../../../../shared/readings/events'

describe('select choices', () => {
  it('leads a list of records with its blank choice', () => {
    const staff = [{ id: 'a1', name: 'Ada' }, { id: 'b2', name: 'Ben' }]
    expect(choicesWithBlank('Unassigned', staff, s => s.id, s => s.name)).toEqual([['', 'Unassigned'], ['a1', 'Ada'], ['b2', 'Ben']])
    expect(choicesWithBlank('No site yet', [], (s: { id: string }) => s.id, () => '')).toEqual([['', 'No site yet']])
  })

  it('shows a kit basis as the kits print it, nitrogen as "as N"', () => {
    expect(kitBasisChoices(AMMONIA_BASES)).toEqual([['NH3', 'NH3'], ['NH4', 'NH4'], ['N', 'as N']])
  })

  it('offers every value of a vocabulary list, in its order, with its words', () => {
    const choices = labelledChoices(EVENT_KINDS, EVENT_LABELS)
    expect(choices.map(([value]) => value)).toEqual([...EVENT_KINDS])
    expect(choices.every(([, label]) => label.length > 0)).toBe(true)
  })

  it('uses a value as its own label where there are no other words', () => {
    expect(plainChoices(['25/25C', '20/20C'])).toEqual([['25/25C', '25/25C'], ['20/20C', '20/20C']])
  })
})
