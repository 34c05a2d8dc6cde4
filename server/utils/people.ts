import { PersonChangeRefused } from '#server/domain/people/people'

/** Runs a people command, turning its refusal (not found, last admin, ...) into the HTTP answer. */
export function personChange<T>(change: () => T): T {
  try {
    return change()
  }
  catch (error) {
    if (error instanceof PersonChangeRefused) throw createError({ statusCode: error.status, statusMessage: error.message })
    throw error
  }
}
