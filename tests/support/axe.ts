/**
 * Runs axe-core (the accessibility engine, loaded from node_modules) inside a playwright
 * page against the WCAG 2.0, 2.1 and 2.2 A and AA rules, and returns what it found.
 */
import { readFileSync } from 'node:fs'
import { createRequire } from 'node:module'
import type { Page } from 'playwright-core'

const AXE_PATH = createRequire(import.meta.url).resolve('axe-core/axe.min.js')
let axeSource: string | undefined
export const WCAG_AA_TAGS = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22a', 'wcag22aa'] as const

export interface AxeViolation {
  id: string
  impact: 'minor' | 'moderate' | 'serious' | 'critical' | null
  help: string
  targets: string[]
}

/** The WCAG A/AA violations on the page as it stands now. */
export async function axeViolations(page: Page): Promise<AxeViolation[]> {
  const loaded = await page.evaluate(() => 'axe' in window)
  // Our Content-Security-Policy refuses inline scripts (page.addScriptTag would be blocked),
  // so the engine is evaluated through the DevTools protocol, which the policy does not govern.
  if (!loaded) await page.evaluate(axeSource ??= readFileSync(AXE_PATH, 'utf8'))
  return page.evaluate(async (tags) => {
    const axe = (window as unknown as { axe: { run: (context: Document, options: object) => Promise<{ violations: { id: string, impact: AxeViolation['impact'], help: string, nodes: { target: unknown[] }[] }[] }> } }).axe
    const result = await axe.run(document, { runOnly: { type: 'tag', values: [...tags] }, resultTypes: ['violations'] })
    return result.violations.map(v => ({ id: v.id, impact: v.impact, help: v.help, targets: v.nodes.map(n => n.target.map(String).join(' ')) }))
  }, [...WCAG_AA_TAGS])
}

/** Serious and critical violations only: the ones that keep someone out of a page. */
export function seriousOnly(violations: AxeViolation[]): AxeViolation[] {
  return violations.filter(v => v.impact === 'serious' || v.impact === 'critical')
}
