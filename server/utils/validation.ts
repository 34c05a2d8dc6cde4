import * as v from 'valibot'
import { FieldRefused, toFieldIssues, type FieldIssue } from '#server/domain/validation/field-issues'

export { toFieldIssues, type FieldIssue } from '#server/domain/validation/field-issues'

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

/**
 * The one field-error answer: 400 'Validation Error' with `data.issues` (field, message),
 * the shape valid() gives and every form reads, plus any `extra` data (the override grounds).
 */
export function fieldError(issues: FieldIssue[], extra: Record<string, unknown> = {}): never {
  throw createError({ statusCode: 400, statusMessage: 'Validation Error', message: issues.map(i => `${i.field}: ${i.message}`).join('; '), data: { ...extra, issues } })
}

/** Runs a domain command, answering its FieldRefused with fieldError. */
export function fieldAnswer<T>(run: () => T): T {
  try {
    return run()
  }
  catch (error) {
    if (error instanceof FieldRefused) fieldError(error.issues)
    throw error
  }
}

/** Parses a value outside h3's validators (e.g. multipart fields), throwing the same 400. */
export function parseOr400<TSchema extends v.GenericSchema>(schema: TSchema, data: unknown): v.InferOutput<TSchema> {
  const result = v.safeParse(schema, data)
  if (result.success) return result.output
  fieldError(toFieldIssues(result.issues))
}
