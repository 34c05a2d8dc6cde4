/**
 * Password rules on every path that sets a password (reset and invitation links share
 * one function): at least 10 characters, and not easy to guess — common passwords,
 * repeats, the product's name and the person's own e-mail are refused with a message
 * that says why and what works better.
 */
import { describe, expect, it } from 'vitest'
import { seedScratchCompany } from '../support/company'
import { ApiClient } from '../support/http'
import { tokenIn, waitForMail } from '../support/mail'

describe('choosing a password with an e-mailed link', () => {
  it('refuses weak and context-bound passwords with a helpful message, and accepts a strong one', async () => {
    const company = await seedScratchCompany('password-rules')
    const email = company.emails.aquarist
    expect((await new ApiClient().post('/api/auth/forgot-password', { email })).status).toBe(200)
    const mail = await waitForMail('reset e-mail', all => all.find(m => m.envelopeTo.includes(email) && /reset/i.test(m.subject)))
    const token = tokenIn(mail.text, '/reset-password')
    const visitor = new ApiClient()
    const localPart = email.split('@')[0]!
    for (const weak of ['aaaaaaaaaa', 'password1234', 'tidewright2026', 'Tidewright!!', `${localPart}1`, 'qwertyuiop']) {
      const refused = await visitor.post('/api/auth/reset-password', { token, password: weak })
      expect(refused.status, weak).toBe(400)
      expect(refused.body.data.issues[0].field).toBe('password')
      expect(refused.body.data.issues[0].message, weak).toMatch(/easy to guess|e-mail address/)
      expect(JSON.stringify(refused.body)).not.toContain(weak)
    }
    const accepted = await visitor.post('/api/auth/reset-password', { token, password: 'lantern-basalt-7-orchard' })
    expect(accepted.status).toBe(200)
  })
})
