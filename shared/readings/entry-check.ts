/**
 * Every message a reading entry earns, in one round: the schema's (a value that is not a
 * number, a date that is not a date) together with the physical bounds and date checks of
 * `toCanonicalReading` for the values that did parse. Without it a form shows the type errors
 * first and the range errors only on the next save.
 */
import * as v from 'valibot'
import { ReadingInputSchema } from '../schemas/reading'
import { INPUT_FIELDS } from '../vocabulary'
import { toCanonicalReading, type EntryIssue } from './entry'

/** Body fields a bad value can be dropped from, so the rest of the entry can still be checked. */
const DROPPABLE: readonly string[] = [...INPUT_FIELDS, 'conductivityTemperatureC', 'notes']

/** The field messages of a reading body (as `POST /api/tanks/:id/readings` takes it), one per field. */
export function readingEntryIssues(body: unknown, now: Date = new Date()): EntryIssue[] {
  const parsed = v.safeParse(ReadingInputSchema, body)
  if (parsed.success) {
    const result = toCanonicalReading(parsed.output, now)
    return result.ok ? [] : firstPerField(result.issues)
  }
  const typed = firstPerField(parsed.issues.map(issue => ({
    field: issue.path?.map(p => String(p.key)).join('.') || '(body)',
    message: issue.message,
  })))
  // Check the rest as if the refused values had not been typed; a date that did not parse
  // is replaced by `now` only so the values can be checked (its own message stays).
  const rest: Record<string, unknown> = { ...(body as Record<string, unknown>) }
  for (const { field } of typed) {
    if (DROPPABLE.includes(field)) rest[field] = null
    else if (field === 'takenAt') rest.takenAt = now.toISOString()
  }
  const again = v.safeParse(ReadingInputSchema, rest)
  if (!again.success) return typed
  const result = toCanonicalReading(again.output, now)
  if (result.ok) return typed
  // Only messages about a value that is there: "enter at least one result" is not true of
  // an entry whose values were refused for their type.
  const more = result.issues.filter(issue => !typed.some(t => t.field === issue.field) && rest[issue.field] != null)
  return firstPerField([...typed, ...more])
}

function firstPerField(issues: readonly EntryIssue[]): EntryIssue[] {
  const seen = new Set<string>()
  return issues.filter(issue => !seen.has(issue.field) && seen.add(issue.field))
}
