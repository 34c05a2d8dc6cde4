/**
 * A company's stored settings text, parsed once per distinct text. Every save reads the company's
 * thresholds for its verdict; parsing the JSON and checking each field again (valibot, time zone
 * lookup) was paid on each of them, though the text rarely changes.
 *
 * Why this cannot serve old settings: the key is the stored text itself (`parsedOncePerText`), and
 * the caller reads the row every time, so a saved change is a new text and is parsed at once.
 * Entries are frozen all the way down, since every reader of the same text gets the same object.
 * Framework-free; one instance per process (the server and each worker thread).
 */
import { parseStoredSettings, type OrganisationSettings } from '../../../shared/schemas/settings'
import { parsedOncePerText } from '../../db/parsed-text'

/** Most distinct texts kept at once (a company's settings are one text; this bounds memory, not a company count). */
export const PARSED_SETTINGS_KEPT = 256

function parseText(text: string): OrganisationSettings {
  let raw: unknown
  try {
    raw = JSON.parse(text)
  }
  catch {
    raw = undefined // a broken text reads as the defaults, as parseStoredSettings reads any broken value
  }
  // Cloned before freezing: the parse shares the defaults' inner objects, which are not ours to freeze.
  return structuredClone(parseStoredSettings(raw))
}

const settingsOfText = parsedOncePerText(parseText, PARSED_SETTINGS_KEPT)

/** The settings a stored text holds, defaults filled in (parseStoredSettings), frozen; the same object for the same text. */
export function settingsFromText(text: string | null | undefined): OrganisationSettings {
  return settingsOfText(text ?? '')
}
