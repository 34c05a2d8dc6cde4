/**
 * Field messages, framework-free: valibot issues turned into `{ field, message }` without
 * echoing the submitted value, and the refusal a domain command throws when one or more
 * fields are wrong. server/utils/validation.ts answers it with the one 400 shape (fieldError).
 */
import type * as v from 'valibot'

export interface FieldIssue {
  field: string
  message: string
}

/** Turns valibot issues into field messages; the submitted values are never echoed. */
export function toFieldIssues(issues: readonly v.BaseIssue<unknown>[]): FieldIssue[] {
  return issues.map(issue => ({
    field: issue.path?.map(item => String(item.key)).join('.') || '(body)',
    // valibot's built-in messages end in `but received <the value>`: never echo input.
    message: issue.message.replace(/ but received [\s\S]*$/, ''),
  }))
}

/** A command refused because of what fields say; the glue answers 400 with these issues. */
export class FieldRefused extends Error {
  constructor(readonly issues: FieldIssue[]) {
    super(issues.map(i => `${i.field}: ${i.message}`).join('; '))
    this.name = 'FieldRefused'
  }
}
