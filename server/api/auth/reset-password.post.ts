/** POST /api/auth/reset-password — sets a new password with the e-mailed single-use reset token and signs in. Returns { user }; 410 if the link is used or expired. */
export default defineEventHandler(event => setPasswordWithToken(event, 'reset'))
