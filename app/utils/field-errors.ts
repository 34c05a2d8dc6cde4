import type * as v from 'valibot'

/** Field messages keyed by field path, from a valibot result or a server 400 (`data.issues`). */
export type FieldErrors = Record<string, string>

export function issuesFromValibot(issues: readonly v.BaseIssue<unknown>[]): FieldErrors {
  const out: FieldErrors = {}
  for (const issue of issues) {
    const field = issue.path?.map(p => String(p.key)).join('.') || '(body)'
    out[field] ??= issue.message
  }
  return out
}

export function issuesFromServer(error: unknown): FieldErrors | null {
  const data = (error as { data?: { data?: { issues?: { field: string, message: string }[] } } })?.data?.data
  if (!data?.issues?.length) return null
  const out: FieldErrors = {}
  for (const issue of data.issues) out[issue.field] ??= issue.message
  return out
}
