/** The words of invitation and password-reset e-mails. */
import { plainHtml } from '../db/alert-mail'

export function inviteMail(name: string, inviter: string, company: string, link: string) {
  const lines = [`Hello ${name},`, `${inviter} has invited you to ${company} on Tidewright.`, 'Choose a password with the link below. The link works once and expires in 7 days.']
  return { subject: `Your invitation to ${company} on Tidewright`, text: [...lines, '', link, '', 'If you did not expect this, ignore this e-mail.'].join('\n'), html: plainHtml([...lines, 'If you did not expect this, ignore this e-mail.'], { href: link, label: 'Set your password' }) }
}

export function resetMail(name: string, link: string) {
  const lines = [`Hello ${name},`, 'Someone (we hope you) asked to reset your Tidewright password.', 'Choose a new password with the link below. The link works once and expires in 1 hour.']
  return { subject: 'Reset your Tidewright password', text: [...lines, '', link, '', 'If you did not ask for this, ignore this e-mail: your password stays as it is.'].join('\n'), html: plainHtml([...lines, 'If you did not ask for this, ignore this e-mail: your password stays as it is.'], { href: link, label: 'Choose a new password' }) }
}
