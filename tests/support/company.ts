/**
 * A fresh company written straight into the test database, for tests that change data:
 * their writes then cannot move the totals other test files expect of the demo company.
 */
import { randomUUID } from 'node:crypto'
import { inject } from 'vitest'
import { openDatabase } from '../../server/db/connection'
import { clients, organisations, sites, users } from '../../server/db/schema'
import { hashPasswordOffline } from '../../server/db/seed/password'
import { PASSWORD } from './fixtures'

export interface ScratchCompany {
  organisationId: string
  clientId: string
  siteId: string
  otherClientId: string
  ids: Record<'admin' | 'aquarist' | 'supervisor' | 'client' | 'otherClient', string>
  emails: Record<'admin' | 'aquarist' | 'supervisor' | 'client' | 'otherClient', string>
}

/** Adds a company with one of each role and two clients (the first with a site and an account); `dbPath`: a server of the test's own. */
export async function seedScratchCompany(label: string, units: 'us' | 'metric' = 'metric', dbPath: string = inject('dbPath')): Promise<ScratchCompany> {
  const db = openDatabase(dbPath)
  const passwordHash = await hashPasswordOffline(PASSWORD)
  const tag = `${label}-${randomUUID().slice(0, 8)}`
  try {
    return db.transaction((tx) => {
      const org = tx.insert(organisations).values({ name: `Scratch ${tag}` }).returning().get()
      const client = tx.insert(clients).values({ organisationId: org.id, name: `Client ${tag}` }).returning().get()
      const otherClient = tx.insert(clients).values({ organisationId: org.id, name: `Second client ${tag}` }).returning().get()
      const site = tx.insert(sites).values({ organisationId: org.id, clientId: client.id, label: 'Front room' }).returning().get()
      const emails = {
        admin: `admin-${tag}@scratch.test`,
        aquarist: `aquarist-${tag}@scratch.test`,
        supervisor: `supervisor-${tag}@scratch.test`,
        client: `client-${tag}@scratch.test`,
        otherClient: `client2-${tag}@scratch.test`,
      }
      const user = (email: string, role: 'admin' | 'aquarist' | 'supervisor' | 'client', clientId: string | null = null) =>
        tx.insert(users).values({ organisationId: org.id, email, name: `${role} ${tag}`, role, passwordHash, clientId, units }).returning().get().id
      const ids = {
        admin: user(emails.admin, 'admin'),
        aquarist: user(emails.aquarist, 'aquarist'),
        supervisor: user(emails.supervisor, 'supervisor'),
        client: user(emails.client, 'client', client.id),
        otherClient: user(emails.otherClient, 'client', otherClient.id),
      }
      return { organisationId: org.id, clientId: client.id, siteId: site.id, otherClientId: otherClient.id, ids, emails }
    })
  }
  finally {
    db.$client.close()
  }
}

/** Reads audit rows for one entity, newest last. */
export function auditRows(entityId: string): { action: string, actorId: string | null, before: unknown, after: unknown }[] {
  const db = openDatabase(inject('dbPath'))
  try {
    return db.$client.prepare('select action, actor_id as actorId, before, after from audit_log where entity_id = ? order by id').all(entityId)
      .map((r: any) => ({ ...r, before: r.before ? JSON.parse(r.before) : null, after: r.after ? JSON.parse(r.after) : null }))
  }
  finally {
    db.$client.close()
  }
}
