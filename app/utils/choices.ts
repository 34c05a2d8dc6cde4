/** One choice of a select: the value sent and the words shown. */
export type Choice = readonly [value: string, label: string]

/** A select's choices from a list of records, led by a blank choice with its own words (e.g. "Unassigned"). */
export function choicesWithBlank<T>(blankLabel: string, items: readonly T[], value: (item: T) => string, label: (item: T) => string): Choice[] {
  return [['', blankLabel], ...items.map(item => [value(item), label(item)] as const)]
}

/** A select's choices where each value is its own label (kit bases, specific-gravity bases). */
export function plainChoices(values: readonly string[]): Choice[] {
  return values.map(value => [value, value] as const)
}

/** The temperature units a thermometer or a file reads in. */
export const TEMPERATURE_CHOICES: readonly Choice[] = [['C', '°C'], ['F', '°F']]

/** A select's choices from a vocabulary list and the words for each of its values. */
export function labelledChoices<V extends string>(values: readonly V[], labels: Readonly<Record<V, string>>): Choice[] {
  return values.map(value => [value, labels[value]] as const)
}

/** A kit basis picker's choices, as the kits print them; nitrogen reads "as N". */
export function kitBasisChoices(bases: readonly string[]): Choice[] {
  return bases.map(basis => [basis, basis === 'N' ? 'as N' : basis] as const)
}

/** A hydrometer's or refractometer's scale, as printed on it: the sample's temperature and the reference water's. */
export const SG_BASIS_CHOICES: readonly Choice[] = [
  ['25/25C', 'Sample 25 °C, reference 25 °C (25/25 °C)'],
  ['20/20C', 'Sample 20 °C, reference 20 °C (20/20 °C)'],
  ['60/60F', 'Sample 60 °F, reference 60 °F (60/60 °F)'],
  ['77/60F', 'Sample 77 °F, reference 60 °F (77/60 °F)'],
]
