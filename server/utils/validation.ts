import * as v from 'valibot'

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

/** The error h3's validators turn into a 400: its enumerable `issues` become the response's `data`. */
class FieldValidationError extends Error {
  constructor(readonly issues: FieldIssue[]) {
    super(issues.map(i => `${i.field}: ${i.message}`).join('; '))
  }
}

/**
 * A validator for h3's readValidatedBody / getValidatedQuery / getValidatedRouterParams:
 * returns the parsed output, or makes h3 answer 400 with `data.issues` (field, message).
 */
export function valid<TSchema extends v.GenericSchema>(schema: TSchema) {
  return (data: unknown): v.InferOutput<TSchema> => {
    const result = v.safeParse(schema, data)
    if (result.success) return result.output
    throw new FieldValidationError(toFieldIssues(result.issues))
  }
}

/** Parses a value outside h3's validators (e.g. multipart fields), throwing the same 400. */
export function parseOr400<TSchema extends v.GenericSchema>(schema: TSchema, data: unknown): v.InferOutput<TSchema> {
  const result = v.safeParse(schema, data)
  if (result.success) return result.output
  const issues = toFieldIssues(result.issues)
  throw createError({ statusCode: 400, statusMessage: 'Validation Error', message: issues.map(i => `${i.field}: ${i.message}`).join('; '), data: { issues } })
}
