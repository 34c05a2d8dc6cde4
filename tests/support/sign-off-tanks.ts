/**
 * A scratch company for sign-off tests, written into the real test database: its own
 * staff and clients, and copies of demo tanks (profile, readings, events) so a test can
 * request, sign, return and reopen without changing anything other test files count.
 * Verdicts are evaluated exactly as the seed does it.
 */
import { eq } from 'drizzle-orm'
import type { TidewrightDB } from '../../server/db/connection'
import { clients, events, organisations, readings, tanks, users } from '../../server/db/schema'
import { hashPasswordOffline } from '../../server/db/seed/password'
import { computeAndStoreVerdict } from '../../server/db/verdicts'
import { PASSWORD } from './fixtures'

/**
 * Copies a tank's readings or events to `tankId`, oldest first. A correction points at the
 * row it corrects: the copy points at the copied row, not the source's (a correction made
 * on the source tank by an earlier test would otherwise collide).
 */
function copyEntries(db: TidewrightDB, table: typeof readings | typeof events, sourceId: string, tankId: string): void {
  const copied = new Map<string, string>()
  const rows: (typeof table.$inferSelect)[] = db.select().from(table).where(eq(table.tankId, sourceId)).orderBy(table.createdAt).all()
  for (const { id, createdAt: _a, updatedAt: _b, ...row } of rows) {
    const correctsId = row.correctsId ? copied.get(row.correctsId) ?? null : null
    copied.set(id, db.insert(table).values({ ...row, correctsId, tankId, enteredBy: null } as typeof table.$inferInsert).returning({ id: table.id }).get().id)
  }
}

/** Copies tank `sourceId` under a new name; returns the new tank's id. */
export function copyTank(db: TidewrightDB, sourceId: string, name: string, overrides: Partial<typeof tanks.$inferInsert> = {}): string {
  const source = db.select().from(tanks).where(eq(tanks.id, sourceId)).get()
  if (!source) throw new Error(`No tank ${sourceId}`)
  const { id: _id, createdAt: _c, updatedAt: _u, ...profile } = source
  const tankId = db.insert(tanks).values({ ...profile, name, ...overrides }).returning().get().id
  copyEntries(db, readings, sourceId, tankId)
  copyEntries(db, events, sourceId, tankId)
  computeAndStoreVerdict(db, tankId, new Date())
  return tankId
}

export const SIGN_OFF_COMPANY = 'Saltmarsh Reef Commissioning'
export const SIGN_OFF_USERS = {
  admin: { email: 'admin@saltmarsh-reef.test', name: 'Perpetua Lindqvist', role: 'admin' },
  aquarist: { email: 'aquarist@saltmarsh-reef.test', name: 'Caspian Oduya', role: 'aquarist' },
  supervisor: { email: 'supervisor@saltmarsh-reef.test', name: 'Marisol Thorne', role: 'supervisor' },
  supervisor2: { email: 'supervisor2@saltmarsh-reef.test', name: 'Ysolde Marchetti', role: 'supervisor' },
  client: { email: 'client@saltmarsh-reef.test', name: 'Bartholomew Keane', role: 'client' },
  client2: { email: 'client2@saltmarsh-reef.test', name: 'Rosalind Achebe', role: 'client' },
} as const

export interface SignOffCompany {
  organisationId: string
  users: Record<keyof typeof SIGN_OFF_USERS, string>
  /** client's tanks: a copy of the demo nano (cycle complete) twice, and of the lounge (mid-cycle) for client2. */
  tanks: { complete: string, toReturn: string, midCycle: string }
}

/** The scratch company with its people and copied tanks. */
export async function seedSignOffCompany(db: TidewrightDB, source: { nano: string, lounge: string }): Promise<SignOffCompany> {
  const passwordHash = await hashPasswordOffline(PASSWORD)
  const org = db.insert(organisations).values({ name: SIGN_OFF_COMPANY }).returning().get()
  const keane = db.insert(clients).values({ organisationId: org.id, name: SIGN_OFF_USERS.client.name }).returning().get().id
  const achebe = db.insert(clients).values({ organisationId: org.id, name: SIGN_OFF_USERS.client2.name }).returning().get().id
  const ids = {} as SignOffCompany['users']
  for (const [key, u] of Object.entries(SIGN_OFF_USERS) as [keyof typeof SIGN_OFF_USERS, (typeof SIGN_OFF_USERS)[keyof typeof SIGN_OFF_USERS]][]) {
    const clientId = key === 'client' ? keane : key === 'client2' ? achebe : null
    ids[key] = db.insert(users).values({ organisationId: org.id, email: u.email, name: u.name, role: u.role, passwordHash, clientId, units: 'metric' }).returning().get().id
  }
  const staff = { organisationId: org.id, siteId: null, aquaristId: ids.aquarist, supervisorId: ids.supervisor }
  return {
    organisationId: org.id,
    users: ids,
    tanks: {
      complete: copyTank(db, source.nano, 'Saltmarsh test nano', { ...staff, clientId: keane, status: 'cycling' }),
      toReturn: copyTank(db, source.nano, 'Saltmarsh returned nano', { ...staff, clientId: keane, status: 'cycling' }),
      midCycle: copyTank(db, source.lounge, 'Saltmarsh test lounge', { ...staff, clientId: achebe, status: 'cycling' }),
    },
  }
}
