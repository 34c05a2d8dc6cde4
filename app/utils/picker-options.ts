/** One choice of a picker: an id and the name shown for it. */
export interface PickerOption { id: string, name: string }

/**
 * The options a picker shows: the page of matches the server sent, with the chosen entry kept
 * at the top when it is not among them (so a search never silently drops what is chosen).
 */
export function pickerOptions(matches: readonly PickerOption[], chosen: PickerOption | null): PickerOption[] {
  if (!chosen || matches.some(option => option.id === chosen.id)) return [...matches]
  return [chosen, ...matches]
}

/** What a picker says under its list when the server holds more than it shows, or null when it shows them all. */
export function pickerCutNote(shown: number, total: number, noun: string): string | null {
  return total > shown ? `Showing ${shown} of ${total} ${noun}. Type in the search box to find the others.` : null
}

/** The server lists a picker can choose from: the list route and the plural noun its notes use. */
export const PICKER_LISTS = {
  tanks: { endpoint: '/api/tanks', noun: 'tanks' },
  clients: { endpoint: '/api/clients', noun: 'clients' },
} as const
export type PickerList = keyof typeof PICKER_LISTS
