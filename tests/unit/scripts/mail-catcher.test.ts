import { describe, expect, it } from 'vitest'
import { parseMail } from '../../../scripts/mail-catcher'

describe('mail catcher parsing', () => {
  it('decodes quoted-printable text and base64 HTML parts of a multipart message', () => {
    const raw = [
      'From: Tidewright <no-reply@tidewright.invalid>',
      'To: someone@tidewright.test',
      'Subject: =?UTF-8?Q?Danger_on_Fernhill?=',
      'Message-ID: <abc@mail.tidewright.invalid>',
      'Content-Type: multipart/alternative; boundary="--b1"',
      '',
      '----b1',
      'Content-Type: text/plain; charset=utf-8',
      'Content-Transfer-Encoding: quoted-printable',
      '',
      'Open http://localhost:3000/reset-password?token=3Dabc and 25 =C2=B0C, a long line th=',
      'at continues.',
      '----b1',
      'Content-Type: text/html; charset=utf-8',
      'Content-Transfer-Encoding: base64',
      '',
      Buffer.from('<p>Hello</p>').toString('base64'),
      '----b1--',
      '',
    ].join('\r\n')
    const mail = parseMail(raw)
    expect(mail.subject).toBe('Danger on Fernhill')
    expect(mail.messageId).toBe('<abc@mail.tidewright.invalid>')
    expect(mail.text).toBe('Open http://localhost:3000/reset-password?token=abc and 25 °C, a long line that continues.')
    expect(mail.html).toBe('<p>Hello</p>')
  })
})
