/** Reads of a company's clients and sites, shaped for the API. Framework-free: each takes a `Db` and the organisation. */
import { and, asc, desc, eq, isNotNull, isNull, sql, type SQL } from 'drizzle-orm'
import type { ClientListQuery } from '#shared/schemas/clients'
import type { ClientList, ClientSummary, ClientView, SiteView } from '#shared/types/clients'
import type { Db } from '#server/db/connection'
import { clients, sites } from '#server/db/schema'

// Written out in full: drizzle drops table names from columns in single-table selects, which would break the correlation.
const tankCount = sql<number>`(select count(*) from "tanks" t where t."client_id" = "clients"."id" and t."archived_at" is null)`
const siteCount = sql<number>`(select count(*) from "sites" s where s."client_id" = "clients"."id" and s."archived_at" is null)`

const SORT = { name: clients.name, updated: clients.updatedAt, tanks: tankCount } as const

type ClientRow = typeof clients.$inferSelect

function toSummary(row: ClientRow, counts: { tankCount: number, siteCount: number }): ClientSummary {
  return {
    id: row.id,
    name: row.name,
    email: row.email,
    phone: row.phone,
    archivedAt: row.archivedAt,
    tankCount: Number(counts.tankCount),
    siteCount: Number(counts.siteCount),
    updatedAt: row.updatedAt,
  }
}

/** A site row shaped for the API. */
export function toSiteView(row: typeof sites.$inferSelect): SiteView {
  return { id: row.id, clientId: row.clientId, label: row.label, address: row.address, roomNotes: row.roomNotes, accessNotes: row.accessNotes, archivedAt: row.archivedAt }
}

/** One page of the organisation's clients, searched by name, e-mail or phone. */
export function listClients(db: Db, organisationId: string, query: ClientListQuery): ClientList {
  const conditions: SQL[] = [eq(clients.organisationId, organisationId)]
  conditions.push(query.archived === 'true' ? isNotNull(clients.archivedAt) : isNull(clients.archivedAt))
  if (query.q) {
    const pattern = `%${query.q.replace(/[%_\\]/g, m => `\\${m}`)}%`
    conditions.push(sql`(${clients.name} like ${pattern} escape '\\' or ${clients.email} like ${pattern} escape '\\' or ${clients.phone} like ${pattern} escape '\\')`)
  }
  const where = and(...conditions)
  const column = SORT[query.sort]
  const rows = db.select({ client: clients, tankCount, siteCount }).from(clients).where(where)
    .orderBy(query.dir === 'asc' ? asc(column) : desc(column), asc(clients.id))
    .limit(query.pageSize).offset((query.page - 1) * query.pageSize).all()
  const total = db.select({ n: sql<number>`count(*)` }).from(clients).where(where).get()?.n ?? 0
  return { items: rows.map(r => toSummary(r.client, r)), total, page: query.page, pageSize: query.pageSize }
}

/** The client row of the organisation, or undefined. Archived clients are still found (to restore or read). */
export function findClient(db: Db, organisationId: string, clientId: string): ClientRow | undefined {
  return db.select().from(clients).where(and(eq(clients.id, clientId), eq(clients.organisationId, organisationId))).get()
}

/** A client's sites, archived ones included, by label. */
export function clientSites(db: Db, clientId: string): SiteView[] {
  return db.select().from(sites).where(eq(sites.clientId, clientId)).orderBy(asc(sites.label), asc(sites.id)).all().map(toSiteView)
}

/** The full view of a client with its sites. */
export function clientView(db: Db, organisationId: string, clientId: string): ClientView | undefined {
  const row = db.select({ client: clients, tankCount, siteCount }).from(clients)
    .where(and(eq(clients.id, clientId), eq(clients.organisationId, organisationId))).get()
  if (!row) return undefined
  return { ...toSummary(row.client, row), notes: row.client.notes, sites: clientSites(db, clientId) }
}

/** The site row of the organisation, or undefined. */
export function findSite(db: Db, organisationId: string, siteId: string) {
  return db.select().from(sites).where(and(eq(sites.id, siteId), eq(sites.organisationId, organisationId))).get()
}
