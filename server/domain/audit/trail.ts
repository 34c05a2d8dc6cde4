/**
 * Reading the audit log: filtered, paginated, each row with who did it, on which tank,
 * and the change in plain words. Admins read the whole company; supervisors the rows of
 * the tanks they supervise. Framework-free.
 */
import { and, desc, eq, gte, inArray, lt, or, sql, type SQL } from 'drizzle-orm'
import { auditActionLabel, auditChanges } from '#shared/audit/words'
import type { AuditQuery } from '#shared/schemas/audit'
import type { AuditList, AuditRowView } from '#shared/types/audit'
import type { Role } from '#shared/types/roles'
import type { Db } from '#server/db/connection'
import { auditLog, tanks, users } from '#server/db/schema'
import { localClock } from '#server/db/reminders'
import { readOrganisationSettings } from '#server/db/settings'

/**
 * The tank an audit row is about. Rows name it directly (a tank), carry it in their
 * before/after (readings, events, uploads, alerts) or point at a row that holds it.
 */
const rowTankId = sql<string | null>`coalesce(
  case when "audit_log"."entity" = 'tank' then "audit_log"."entity_id" end,
  json_extract("audit_log"."after", '$.tankId'),
  json_extract("audit_log"."before", '$.tankId'),
  case "audit_log"."entity"
    when 'reading' then (select r."tank_id" from "readings" r where r."id" = "audit_log"."entity_id")
    when 'event' then (select e."tank_id" from "events" e where e."id" = "audit_log"."entity_id")
    when 'plan_stage' then (select s."tank_id" from "plan_stages" s where s."id" = "audit_log"."entity_id")
    when 'sign_off' then (select o."tank_id" from "sign_offs" o where o."id" = "audit_log"."entity_id")
    when 'alert' then (select a."tank_id" from "alerts" a where a."id" = "audit_log"."entity_id")
    when 'upload' then (select u."tank_id" from "uploads" u where u."id" = "audit_log"."entity_id")
  end)`

export interface AuditReader { id: string, organisationId: string, role: Role }

const DAY_MS = 86_400_000

/** The instant (ISO, UTC) a calendar day begins on a time zone's clock, summer-time days included. */
export function dayStartIn(day: string, timeZone: string): string {
  const midnight = Date.parse(`${day}T00:00:00Z`)
  // A zone's offset at an instant: its wall clock read as if it were UTC, less the instant.
  const offset = (ms: number) => {
    const local = localClock(new Date(ms), timeZone)
    return Date.parse(`${local.date}T00:00:00Z`) + local.minutes * 60_000 - ms
  }
  // Twice: the offset at local midnight may differ from the one at UTC midnight.
  return new Date(midnight - offset(midnight - offset(midnight))).toISOString()
}

function conditions(reader: AuditReader, query: AuditQuery, timeZone: string): SQL[] {
  const out: SQL[] = [eq(auditLog.organisationId, reader.organisationId)]
  if (reader.role === 'supervisor') {
    out.push(sql`${rowTankId} in (select k."id" from "tanks" k where k."supervisor_id" = ${reader.id} and k."organisation_id" = ${reader.organisationId})`)
  }
  if (query.tankId) out.push(sql`${rowTankId} = ${query.tankId}`)
  if (query.actorId) out.push(eq(auditLog.actorId, query.actorId))
  if (query.action) {
    out.push(query.action.includes('.') ? eq(auditLog.action, query.action) : or(eq(auditLog.action, query.action), sql`${auditLog.action} like ${`${query.action}.%`}`)!)
  }
  // Days are the company's days, as the trail shows its times.
  if (query.from) out.push(gte(auditLog.at, dayStartIn(query.from, timeZone)))
  if (query.to) out.push(lt(auditLog.at, dayStartIn(new Date(Date.parse(`${query.to}T00:00:00Z`) + DAY_MS).toISOString().slice(0, 10), timeZone)))
  return out
}

type Page = Pick<AuditQuery, 'page' | 'pageSize'>

/** One page of the trail, newest first (or every matching row, for the export, when `page` is null). */
export function readAuditTrail(db: Db, reader: AuditReader, query: Omit<AuditQuery, 'page' | 'pageSize'> & Partial<Page>, page: Page | null): AuditList {
  const { timeZone } = readOrganisationSettings(db, reader.organisationId)
  const where = and(...conditions(reader, { ...query, page: 1, pageSize: 1 }, timeZone))
  let select = db.select({
    row: auditLog,
    tankId: rowTankId,
    actorName: sql<string | null>`(select p."name" from "users" p where p."id" = "audit_log"."actor_id")`,
  }).from(auditLog).where(where).orderBy(desc(auditLog.at), desc(auditLog.id)).$dynamic()
  if (page) select = select.limit(page.pageSize).offset((page.page - 1) * page.pageSize)
  const rows = select.all()
  const total = db.select({ n: sql<number>`count(*)` }).from(auditLog).where(where).get()?.n ?? 0
  const tankIds = [...new Set(rows.map(r => r.tankId).filter((id): id is string => !!id))]
  const tankNames = new Map(tankIds.length
    ? db.select({ id: tanks.id, name: tanks.name }).from(tanks).where(and(eq(tanks.organisationId, reader.organisationId), inArray(tanks.id, tankIds))).all().map(t => [t.id, t.name])
    : [])
  return {
    items: rows.map((r): AuditRowView => ({
      id: r.row.id,
      at: r.row.at,
      actorId: r.row.actorId,
      actorName: r.actorName,
      action: r.row.action,
      actionLabel: auditActionLabel(r.row.action),
      entity: r.row.entity,
      entityId: r.row.entityId,
      tankId: r.tankId,
      tankName: r.tankId ? tankNames.get(r.tankId) ?? null : null,
      changes: auditChanges(r.row.before, r.row.after),
    })),
    total: Number(total),
    timeZone,
    page: page?.page ?? 1,
    pageSize: page?.pageSize ?? rows.length,
  }
}

/** The people who appear in the company's trail, for the viewer's person filter. */
export function auditPeople(db: Db, organisationId: string) {
  return db.select({ id: users.id, name: users.name }).from(users).where(eq(users.organisationId, organisationId)).orderBy(users.name).all()
}
