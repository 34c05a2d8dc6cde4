import { existsSync, readFileSync } from 'node:fs'
import { resolve } from 'node:path'
import type { CaughtMail } from '#shared/types/mail'

/**
 * GET /api/dev/mail — what the local mail catcher caught, newest first (admin only).
 * Exists only with NUXT_DEV_MAIL=1 (dev, demo, tests); otherwise 404. Returns { items: CaughtMail[] }.
 */
export default defineEventHandler(async (event) => {
  const config = useRuntimeConfig()
  requireSwitch(config.devMail)
  await requireActor(event, ['admin'])
  const file = resolve(String(config.devMailFile))
  const items = existsSync(file)
    ? readFileSync(file, 'utf8').split('\n').filter(Boolean).map(line => JSON.parse(line) as CaughtMail)
    : []
  return { items: items.reverse() }
})
