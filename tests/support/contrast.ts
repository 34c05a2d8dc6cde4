/**
 * WCAG 2.x contrast ratio between two sRGB colours, and the Tidewright theme's colours by
 * class name (our tailwind.config.ts over Tailwind's own palette), for checks on the theme.
 * Formula: W3C WCAG 2.2, "relative luminance" and "contrast ratio" definitions.
 */
import tailwindColours from 'tailwindcss/colors'
import theme from '../../tailwind.config'

function luminance(hex: string): number {
  const [r, g, b] = [1, 3, 5].map((i) => {
    const c = parseInt(hex.slice(i, i + 2), 16) / 255
    return c <= 0.03928 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4
  })
  return 0.2126 * r! + 0.7152 * g! + 0.0722 * b!
}

export function contrastRatio(a: string, b: string): number {
  const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x)
  return (hi! + 0.05) / (lo! + 0.05)
}

type Palette = Record<string, string | Record<string, string>>
const OURS = theme.theme.extend.colors as Palette
const TAILWIND = tailwindColours as unknown as Palette

/** The hex colour a class suffix names: 'ink-faint', 'ink', 'signal-caution', 'amber-50', 'white'. */
export function themeColour(name: string): string {
  if (name === 'white') return '#ffffff'
  if (name === 'black') return '#000000'
  const dash = name.lastIndexOf('-')
  const family = dash < 0 ? name : name.slice(0, dash)
  const shade = dash < 0 ? 'DEFAULT' : name.slice(dash + 1)
  const entry = OURS[family] ?? TAILWIND[family]
  const hex = typeof entry === 'string' ? entry : entry?.[shade]
  if (!hex) throw new Error(`no colour ${name}`)
  return hex
}
