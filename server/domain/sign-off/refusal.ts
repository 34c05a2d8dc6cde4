/**
 * Why a sign-off command said no, without HTTP: the Nitro glue (server/utils/sign-offs.ts,
 * sign-off-lock.ts) turns it into the answer. A refusal about one field of the form
 * (`field`) becomes a 400 with that field's message; the others keep their status.
 */
export class SignOffRefused extends Error {
  constructor(
    readonly status: 400 | 403 | 404 | 409,
    message: string,
    readonly details: { field?: string, data?: Record<string, unknown> } = {},
  ) {
    super(message)
    this.name = 'SignOffRefused'
  }
}

/** Refuses with 409: the tank or the request is not in a state the command applies to. */
export function conflict(message: string, data?: Record<string, unknown>): never {
  throw new SignOffRefused(409, message, { data })
}
