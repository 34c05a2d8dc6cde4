/** Server settings that send mail to a running catcher and enable the test-only routes (worker tick, caught mail). */
import type { MailCatcher } from '../../scripts/mail-catcher'

export function mailCatcherEnv(mail: MailCatcher): Record<string, string> {
  return {
    NUXT_SMTP_HOST: '127.0.0.1',
    NUXT_SMTP_PORT: String(mail.port),
    NUXT_DEV_MAIL: '1',
    NUXT_DEV_MAIL_FILE: mail.file,
    NUXT_TEST_HOOKS: '1',
    NUXT_WORKER_INTERVAL_MS: '300',
  }
}
