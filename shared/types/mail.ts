/** One message the local mail catcher caught, as stored in its JSON-lines file and shown on /admin/mail. */
export interface CaughtMail {
  receivedAt: string
  envelopeFrom: string
  envelopeTo: string[]
  messageId: string
  from: string
  to: string
  subject: string
  text: string
  html: string | null
  headers: Record<string, string>
}
