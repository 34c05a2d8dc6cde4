/**
 * Delivers the mail outbox over SMTP with nodemailer. Each row is claimed (marked
 * `sending`) atomically before it is sent and keeps its stable Message-ID, so a mail
 * server that is down loses nothing and a retry is recognisable downstream.
 */
import nodemailer, { type Transporter } from 'nodemailer'
import { claimNextMail, markMailFailed, markMailSent } from '#server/db/outbox'

let transporter: Transporter | undefined
let transporterKey = ''

function smtpSettings() {
  const smtp = useRuntimeConfig().smtp
  return {
    host: String(smtp.host || ''),
    port: Number(smtp.port) || 587,
    user: String(smtp.user || ''),
    pass: String(smtp.pass || ''),
    from: String(smtp.from || 'Tidewright <no-reply@tidewright.invalid>'),
    secure: isOn(smtp.secure),
  }
}

function transport(): Transporter | undefined {
  const s = smtpSettings()
  if (!s.host) return undefined
  const key = `${s.host}:${s.port}:${s.user}:${s.secure}`
  if (!transporter || key !== transporterKey) {
    transporter = nodemailer.createTransport({
      host: s.host,
      port: s.port,
      secure: s.secure,
      auth: s.user ? { user: s.user, pass: s.pass } : undefined,
      connectionTimeout: 10_000,
      greetingTimeout: 10_000,
      socketTimeout: 20_000,
    })
    transporterKey = key
  }
  return transporter
}

export interface DeliveryResult { sent: number, failed: number }

let running: Promise<DeliveryResult> | null = null

async function deliverLoop(now: Date, limit: number): Promise<DeliveryResult> {
  const result: DeliveryResult = { sent: 0, failed: 0 }
  const mailer = transport()
  if (!mailer) return result
  const from = smtpSettings().from
  for (let i = 0; i < limit; i++) {
    const row = await writeTransaction(tx => claimNextMail(tx, now))
    if (!row) break
    try {
      await mailer.sendMail({
        from,
        to: row.toAddress,
        subject: row.subject,
        text: row.textBody,
        html: row.htmlBody ?? undefined,
        messageId: row.messageId,
        headers: { 'X-Tidewright-Kind': row.kind },
      })
      await writeTransaction(tx => markMailSent(tx, row.id))
      result.sent++
    }
    catch (error) {
      await writeTransaction(tx => markMailFailed(tx, row, error instanceof Error ? error.message : String(error), new Date(Math.max(now.getTime(), Date.now()))))
      result.failed++
      // The server is likely down: stop this round and let the back-off space the retries.
      break
    }
  }
  return result
}

/** Sends the mail due at `now` (at most `limit` messages). Concurrent calls share one run. */
export async function deliverDueMail(now = new Date(), limit = 50): Promise<DeliveryResult> {
  while (running) await running.catch(() => undefined)
  running = deliverLoop(now, limit)
  try {
    return await running
  }
  finally {
    running = null
  }
}

/** Starts a delivery round right away (after the current request), so new mail need not wait for the next interval. */
export function kickMailWorker(): void {
  setTimeout(() => {
    deliverDueMail().catch(error => console.error('Tidewright mail:', error instanceof Error ? error.message : error))
  }, 0)
}
