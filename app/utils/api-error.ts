import type * as v from 'valibot'

/** Field messages keyed by field path (`name`, `dimensions.lengthMm`): one message a field. */
export type FieldErrors = Record<string, string>

interface ApiErrorShape {
  data?: { statusMessage?: string, message?: string, data?: { issues?: { field: string, message: string }[] } }
}

/** The message a failed $fetch carries from the server, or a fallback (no answer at all, say). */
export function apiErrorMessage(error: unknown, fallback: string): string {
  const data = (error as ApiErrorShape | null)?.data
  return data?.statusMessage || data?.message || fallback
}

/** The server's per-field messages of a failed $fetch (a 400's `data.issues`), or null when it sent none. */
export function serverFieldErrors(error: unknown): FieldErrors | null {
  const issues = (error as ApiErrorShape | null)?.data?.data?.issues
  if (!issues?.length) return null
  const out: FieldErrors = {}
  for (const issue of issues) out[issue.field] ??= issue.message
  return out
}

/** A valibot result's issues as field messages, the first for each field; `(body)` for the whole. */
export function schemaFieldErrors(issues: readonly v.BaseIssue<unknown>[]): FieldErrors {
  const out: FieldErrors = {}
  for (const issue of issues) {
    const field = issue.path?.map(p => String(p.key)).join('.') || '(body)'
    out[field] ??= issue.message
  }
  return out
}
