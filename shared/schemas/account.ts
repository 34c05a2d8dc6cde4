import * as v from 'valibot'
import { ROLES } from '../vocabulary'
import { UnitSystemSchema } from './common'

const Email = v.pipe(v.string('Enter an e-mail address.'), v.trim(), v.toLowerCase(), v.maxLength(254, 'That e-mail address is too long.'), v.email('Enter a valid e-mail address.'))

/** Password rules: at least 10 characters, at most 200. */
export const PasswordSchema = v.pipe(
  v.string('Choose a password.'),
  v.minLength(10, 'Use at least 10 characters.'),
  v.maxLength(200, 'That password is too long.'),
)

/** The rule a schema alone cannot check: a password must not be the e-mail address (or its name part). */
export function passwordProblem(password: string, email: string): string | null {
  const p = password.trim().toLowerCase()
  const e = email.trim().toLowerCase()
  if (p === e || p === e.split('@')[0]) return 'Do not use your e-mail address as your password.'
  return null
}

/** POST /api/invitations body. Clients need the client record the account belongs to. */
export const InvitationSchema = v.pipe(
  v.object({
    email: Email,
    name: v.pipe(v.string('Enter a name.'), v.trim(), v.minLength(1, 'Enter a name.'), v.maxLength(120, 'Keep the name under 120 characters.')),
    role: v.picklist(ROLES, 'Choose a role.'),
    clientId: v.optional(v.pipe(v.string(), v.uuid('Not a valid client id.'))),
    /** The units the new person reads in; the company's default when left out. */
    units: v.optional(UnitSystemSchema),
  }),
  v.forward(v.check(input => input.role !== 'client' || !!input.clientId, 'Choose the client this account belongs to.'), ['clientId']),
)
export type InvitationInput = v.InferOutput<typeof InvitationSchema>

/** POST /api/auth/forgot-password body. */
export const ForgotPasswordSchema = v.object({ email: Email })

/** Token from an e-mailed link: url-safe base64 of 32 random bytes. */
export const TokenSchema = v.pipe(v.string('The link is incomplete.'), v.regex(/^[\w-]{43}$/, 'The link is incomplete.'))

/** POST /api/auth/accept-invite and /api/auth/reset-password body. */
export const SetPasswordSchema = v.object({ token: TokenSchema, password: PasswordSchema })

/** GET /api/auth/token query. */
export const TokenQuery = v.object({ token: TokenSchema })

/** PUT /api/me/units body: the unit system the person reads and types in, on every screen, e-mail and certificate. */
export const UnitsPreferenceSchema = v.object({ units: UnitSystemSchema })
