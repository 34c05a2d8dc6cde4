/**
 * Every text and status colour in the theme reaches WCAG 2.2 AA contrast for normal text
 * (4.5:1, success criterion 1.4.3) on every surface it is drawn on, and every status pill is
 * told apart from its neighbours by shape as well as tint (1.4.1). axe-core checks the
 * rendered pages (tests/browser/accessibility.test.ts); this checks colours no demo page shows.
 */
import { describe, expect, it } from 'vitest'
import { ALERT_STATUS_LOOKS, PERSON_STATUS_LOOKS, TANK_STATUS_LOOKS, type StatusLook } from '../../../app/utils/status-looks'
import { contrastRatio, themeColour } from '../../support/contrast'

const AA_TEXT = 4.5
const SURFACES = ['white', 'sand-50', 'sand-100', 'sand-200']
const TEXT_COLOURS = ['ink', 'ink-soft', 'ink-faint', 'tide-600', 'tide-700', 'signal-safe', 'signal-caution', 'signal-danger', 'signal-info']

describe('theme contrast', () => {
  it('matches the WCAG worked values: black on white is 21:1, white on white 1:1', () => {
    expect(contrastRatio('#000000', '#ffffff')).toBeCloseTo(21, 5)
    expect(contrastRatio('#ffffff', '#ffffff')).toBe(1)
  })

  for (const text of TEXT_COLOURS) {
    it(`${text} text is 4.5:1 or more on ${SURFACES.join(', ')}`, () => {
      const low = SURFACES.map(s => [s, contrastRatio(themeColour(text), themeColour(s))] as const).filter(([, r]) => r < AA_TEXT)
      expect(low).toEqual([])
    })
  }

  it('white text is 4.5:1 or more on every signal colour used as a fill', () => {
    for (const fill of ['signal-safe', 'signal-caution', 'signal-danger', 'signal-info', 'tide-600']) {
      expect(contrastRatio('#ffffff', themeColour(fill)), fill).toBeGreaterThanOrEqual(AA_TEXT)
    }
  })
})

function toneColours(look: StatusLook): { bg: string, text: string } {
  const bg = look.tone.match(/(?:^| )bg-([a-z0-9-]+)/)?.[1]
  const text = look.tone.match(/(?:^| )text-([a-z0-9-]+)/)?.[1]
  if (!bg || !text) throw new Error(`tone without a tint and a text colour: ${look.tone}`)
  return { bg: themeColour(bg), text: themeColour(text) }
}

describe('status pills', () => {
  for (const [name, looks] of Object.entries({ tank: TANK_STATUS_LOOKS, person: PERSON_STATUS_LOOKS, alert: ALERT_STATUS_LOOKS })) {
    const entries = Object.entries(looks as Record<string, StatusLook>)
    it(`each ${name} status has a shape and a tint of its own`, () => {
      expect(new Set(entries.map(([, l]) => l.shape)).size).toBe(entries.length)
      expect(new Set(entries.map(([, l]) => l.tone)).size).toBe(entries.length)
    })
    it(`each ${name} status's words are 4.5:1 or more on its tint`, () => {
      const low = entries.map(([status, l]) => { const { bg, text } = toneColours(l); return [status, contrastRatio(text, bg)] as const }).filter(([, r]) => r < AA_TEXT)
      expect(low).toEqual([])
    })
  }
})
