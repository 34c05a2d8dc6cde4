import { Hash } from '@adonisjs/hash'
import { Scrypt } from '@adonisjs/hash/drivers/scrypt'

// The same driver and defaults nuxt-auth-utils uses, so seeded accounts sign in normally.
const hash = new Hash(new Scrypt({}))

/** Hashes a password outside the server (seed and test fixtures). */
export function hashPasswordOffline(password: string): Promise<string> {
  return hash.make(password)
}
