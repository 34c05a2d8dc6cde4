import * as v from 'valibot'

/** Sign-in form and POST /api/auth/login body. */
export const LoginSchema = v.object({
  email: v.pipe(v.string('Enter your e-mail address.'), v.trim(), v.toLowerCase(), v.maxLength(254, 'That e-mail address is too long.'), v.email('Enter a valid e-mail address.')),
  password: v.pipe(v.string('Enter your password.'), v.minLength(1, 'Enter your password.'), v.maxLength(200, 'That password is too long.')),
})
export type LoginInput = v.InferOutput<typeof LoginSchema>
