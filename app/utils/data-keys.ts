/**
 * The `useFetch` keys of a tank's data, written once: the composable that reads a resource and
 * the form that changes it name the same key, so a save refreshes exactly what it changed.
 */
export const tankDataKeys = {
  tank: (tankId: string) => `tank-${tankId}`,
  verdict: (tankId: string) => `verdict-${tankId}`,
  readings: (tankId: string) => `readings-${tankId}`,
  events: (tankId: string) => `events-${tankId}`,
  chart: (tankId: string) => `chart-${tankId}`,
  plan: (tankId: string) => `tank-plan-${tankId}`,
  signOff: (tankId: string) => `sign-off-${tankId}`,
  evidence: (tankId: string) => `evidence-${tankId}`,
} as const

export type TankDataPart = keyof typeof tankDataKeys

/** The keys of the named parts of one tank's data, for `refreshNuxtData`. */
export function tankDataKeysFor(tankId: string, parts: readonly TankDataPart[]): string[] {
  return parts.map(part => tankDataKeys[part](tankId))
}
