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
    // Servers started with this share one client address across many test files; the mail
    // limits' own defaults are tested on a server of their own (tests/api/throttle.test.ts).
    NUXT_MAIL_THROTTLE_RESET_PER_ADDRESS_PER_HOUR: '50',
    NUXT_MAIL_THROTTLE_RESET_PER_NETWORK_PER_HOUR: '1000',
    NUXT_MAIL_THROTTLE_INVITE_PER_ADDRESS_PER_DAY: '50',
    NUXT_MAIL_THROTTLE_INVITE_PER_ACCOUNT_PER_HOUR: '1000',
  }
}
