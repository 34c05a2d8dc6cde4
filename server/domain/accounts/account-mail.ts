/**
 * Account e-mails, framework-free: the words of invitation and password-reset mails, and
 * queueing them inside the caller's transaction with a fresh single-use link (a new link
 * retires the older ones). `baseUrl` is the public base URL for links.
 */
import { eq } from 'drizzle-orm'
import type { Db } from '#server/db/connection'
import { enqueueMail } from '#server/db/outbox'
import { organisations } from '#server/db/schema'
import { plainHtml } from '#server/domain/alerts/mail'
import { issueToken } from './tokens'

/** An invitation: who invited them to which company, and the link to choose a password. */
export function inviteMail(name: string, inviter: string, company: string, link: string) {
  const lines = [`Hello ${name},`, `${inviter} has invited you to ${company} on Tidewright.`, 'Choose a password with the link below. The link works once and expires in 7 days.']
  return { subject: `Your invitation to ${company} on Tidewright`, text: [...lines, '', link, '', 'If you did not expect this, ignore this e-mail.'].join('\n'), html: plainHtml([...lines, 'If you did not expect this, ignore this e-mail.'], { href: link, label: 'Set your password' }) }
}

/** A password reset: the link to choose a new password. */
export function resetMail(name: string, link: string) {
  const lines = [`Hello ${name},`, 'Someone (we hope you) asked to reset your Tidewright password.', 'Choose a new password with the link below. The link works once and expires in 1 hour.']
  return { subject: 'Reset your Tidewright password', text: [...lines, '', link, '', 'If you did not ask for this, ignore this e-mail: your password stays as it is.'].join('\n'), html: plainHtml([...lines, 'If you did not ask for this, ignore this e-mail: your password stays as it is.'], { href: link, label: 'Choose a new password' }) }
}

/** To an address that already has an account, when someone invites it again: no new account, a pointer to sign in. */
export function alreadyHasAccountMail(name: string, inviter: string, company: string, signInLink: string, resetLink: string) {
  const lines = [`Hello ${name},`, `${inviter} invited this address to ${company} on Tidewright, but it already has a Tidewright account, so no new account was made.`, `Sign in at ${signInLink}. If you forgot your password, choose a new one at ${resetLink}. If you expected to join ${company} with this address, ask ${inviter} to contact your current company's admin.`]
  return { subject: 'You already have a Tidewright account', text: [...lines, '', 'If you did not expect this, ignore this e-mail.'].join('\n'), html: plainHtml([...lines, 'If you did not expect this, ignore this e-mail.'], { href: signInLink, label: 'Sign in' }) }
}

interface Recipient { id: string, name: string, email: string, organisationId: string }

const link = (baseUrl: string, path: string, token: string) => `${baseUrl.replace(/\/+$/, '')}${path}?token=${token}`

/** Issues a fresh invitation link for the person and queues its e-mail, signed by the inviter. */
export function queueInvitation(db: Db, person: Recipient, inviterName: string, baseUrl: string, now: Date): void {
  const company = db.select({ name: organisations.name }).from(organisations).where(eq(organisations.id, person.organisationId)).get()?.name ?? 'your company'
  const token = issueToken(db, person.id, 'invite', now)
  const words = inviteMail(person.name, inviterName, company, link(baseUrl, '/accept-invite', token))
  enqueueMail(db, { organisationId: person.organisationId, to: person.email, kind: 'invite', ...words }, now)
}

/** Issues a fresh password-reset link for the person and queues its e-mail. */
export function queuePasswordReset(db: Db, person: Recipient, baseUrl: string, now: Date): void {
  const token = issueToken(db, person.id, 'reset', now)
  const words = resetMail(person.name, link(baseUrl, '/reset-password', token))
  enqueueMail(db, { organisationId: person.organisationId, to: person.email, kind: 'reset', ...words }, now)
}
