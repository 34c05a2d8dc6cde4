/** The words of invitation and password-reset e-mails. */
import { plainHtml } from '../domain/alerts/mail'

export function inviteMail(name: string, inviter: string, company: string, link: string) {
  const lines = [`Hello ${name},`, `${inviter} has invited you to ${company} on Tidewright.`, 'Choose a password with the link below. The link works once and expires in 7 days.']
  return { subject: `Your invitation to ${company} on Tidewright`, text: [...lines, '', link, '', 'If you did not expect this, ignore this e-mail.'].join('\n'), html: plainHtml([...lines, 'If you did not expect this, ignore this e-mail.'], { href: link, label: 'Set your password' }) }
}

export function resetMail(name: string, link: string) {
  const lines = [`Hello ${name},`, 'Someone (we hope you) asked to reset your Tidewright password.', 'Choose a new password with the link below. The link works once and expires in 1 hour.']
  return { subject: 'Reset your Tidewright password', text: [...lines, '', link, '', 'If you did not ask for this, ignore this e-mail: your password stays as it is.'].join('\n'), html: plainHtml([...lines, 'If you did not ask for this, ignore this e-mail: your password stays as it is.'], { href: link, label: 'Choose a new password' }) }
}

/** To an address that already has an account, when someone invites it again: no new account, a pointer to sign in. */
export function alreadyHasAccountMail(name: string, inviter: string, company: string, signInLink: string, resetLink: string) {
  const lines = [`Hello ${name},`, `${inviter} invited this address to ${company} on Tidewright, but it already has a Tidewright account, so no new account was made.`, `Sign in at ${signInLink}. If you forgot your password, choose a new one at ${resetLink}. If you expected to join ${company} with this address, ask ${inviter} to contact your current company's admin.`]
  return { subject: 'You already have a Tidewright account', text: [...lines, '', 'If you did not expect this, ignore this e-mail.'].join('\n'), html: plainHtml([...lines, 'If you did not expect this, ignore this e-mail.'], { href: signInLink, label: 'Sign in' }) }
}
