/** POST /api/auth/accept-invite — sets the invited user's password with the e-mailed single-use token and signs them in. Returns { user }; 410 if the link is used or expired. */
export default defineEventHandler(event => setPasswordWithToken(event, 'invite'))
