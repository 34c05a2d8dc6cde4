/** Reads tanks with their client, site, staff and stored phase, shaped for the API. */
import { and, asc, desc, eq, or, sql, type SQL } from 'drizzle-orm'
import { alias } from 'drizzle-orm/sqlite-core'
import type { CycleForecast } from '#shared/cycle/forecast'
import type { TankListQuery } from '#shared/schemas/tank-list'
import type { CyclePhase, TankList, TankSummary, TankView } from '#shared/types/tanks'
import { clients, planStages, sites, tankVerdicts, tanks, users } from '#server/db/schema'
import { netWaterLitres } from '#shared/plan/net-volume'
import { preparedFor, visibleTankPlaceholders, visibleTankValues, type Actor } from './access'
import { preparedPerDb } from '#server/db/prepared'
import { listedForecast } from '#server/domain/forecast/tank-forecast'
import { storedForecasts } from '#server/db/verdicts'

const aquarist = alias(users, 'aquarist')
const supervisor = alias(users, 'supervisor')

// The first stage that is neither done nor skipped: where the build stands.
const open = sql`${planStages.tankId} = ${tanks.id} and ${planStages.status} not in ('done', 'skipped')`
const currentStageKey = sql<string | null>`(select ${planStages.key} from ${planStages} where ${open} order by ${planStages.position} limit 1)`
const currentStageTitle = sql<string | null>`(select ${planStages.title} from ${planStages} where ${open} order by ${planStages.position} limit 1)`
const currentStagePosition = sql<number>`coalesce((select ${planStages.position} from ${planStages} where ${open} order by ${planStages.position} limit 1), 100000)`
const stagesDone = sql<number>`(select count(*) from ${planStages} where ${planStages.tankId} = ${tanks.id} and ${planStages.status} in ('done', 'skipped'))`
const stagesTotal = sql<number>`(select count(*) from ${planStages} where ${planStages.tankId} = ${tanks.id})`

function baseQuery() {
  return useDB().select({
    tank: tanks,
    clientName: clients.name,
    siteLabel: sites.label,
    aquaristName: aquarist.name,
    supervisorName: supervisor.name,
    phase: tankVerdicts.phase,
    currentStageKey,
    currentStageTitle,
    stagesDone,
    stagesTotal,
  }).from(tanks)
    .innerJoin(clients, eq(clients.id, tanks.clientId))
    .leftJoin(sites, eq(sites.id, tanks.siteId))
    .leftJoin(aquarist, eq(aquarist.id, tanks.aquaristId))
    .leftJoin(supervisor, eq(supervisor.id, tanks.supervisorId))
    .leftJoin(tankVerdicts, eq(tankVerdicts.tankId, tanks.id))
}
type Row = NonNullable<Awaited<ReturnType<ReturnType<typeof baseQuery>['get']>>>

function toSummary(row: Row): TankSummary {
  const t = row.tank
  return {
    id: t.id,
    name: t.name,
    status: t.status,
    cycleMethod: t.cycleMethod,
    volumeLitres: t.volumeLitres,
    clientId: t.clientId,
    clientName: row.clientName,
    siteLabel: row.siteLabel,
    aquaristName: row.aquaristName,
    phase: (row.phase as CyclePhase | null) ?? null,
    currentStageKey: row.currentStageKey ?? null,
    currentStageTitle: row.currentStageTitle ?? null,
    stagesDone: Number(row.stagesDone ?? 0),
    stagesTotal: Number(row.stagesTotal ?? 0),
    cycleStartedAt: t.cycleStartedAt,
    updatedAt: t.updatedAt,
  }
}

const SORT_COLUMNS = {
  name: tanks.name,
  status: tanks.status,
  client: clients.name,
  updated: tanks.updatedAt,
  stage: currentStagePosition,
} as const

/** A list item with its stored forecast when the cycle is what the reader waits for. */
function withForecast(summary: TankSummary, stored: CycleForecast | null | undefined): TankSummary {
  const forecast = listedForecast(summary, stored)
  return forecast ? { ...summary, forecast } : summary
}

/** What decides a list statement's SQL: which filters are given, the sort and whose view it is (their values are bound). */
interface ListShape {
  client: boolean
  status: boolean
  clientId: boolean
  stage: 'none' | 'complete' | 'key'
  q: boolean
  sort: TankListQuery['sort']
  dir: TankListQuery['dir']
}

/**
 * The page and count statements of one list shape, values as placeholders. Building a query
 * of this size with Drizzle on every request cost more than running it (a third of the
 * route's time in the profile), so each shape is built and prepared the first time it is
 * asked for, then only bound and run. There are at most a few hundred shapes.
 */
function prepareList(shape: ListShape) {
  const conditions: SQL[] = [shape.client ? visibleTankPlaceholders.client : visibleTankPlaceholders.staff]
  if (shape.status) conditions.push(eq(tanks.status, sql.placeholder('status')))
  if (shape.clientId) conditions.push(eq(tanks.clientId, sql.placeholder('listClientId')))
  if (shape.stage === 'complete') conditions.push(sql`${currentStageKey} is null`)
  else if (shape.stage === 'key') conditions.push(sql`${currentStageKey} = ${sql.placeholder('stage')}`)
  if (shape.q) conditions.push(or(sql`${tanks.name} like ${sql.placeholder('pattern')} escape '\\'`, sql`${clients.name} like ${sql.placeholder('pattern')} escape '\\'`)!)
  const where = and(...conditions)
  const column = SORT_COLUMNS[shape.sort]
  const order = shape.dir === 'asc' ? asc(column) : desc(column)
  return {
    page: baseQuery().where(where).orderBy(order, asc(tanks.id)).limit(sql.placeholder('limit')).offset(sql.placeholder('offset')).prepare(),
    count: useDB().select({ n: sql<number>`count(*)` }).from(tanks).innerJoin(clients, eq(clients.id, tanks.clientId)).where(where).prepare(),
  }
}

const listStatements = preparedPerDb(() => new Map<string, ReturnType<typeof prepareList>>())

function listStatementsFor(shape: ListShape): ReturnType<typeof prepareList> {
  const byShape = listStatements(useDB())
  const key = `${shape.client}|${shape.status}|${shape.clientId}|${shape.stage}|${shape.q}|${shape.sort}|${shape.dir}`
  let statements = byShape.get(key)
  if (!statements) {
    statements = prepareList(shape)
    byShape.set(key, statements)
  }
  return statements
}

/** One page of the tanks the actor may see, filtered and sorted on the server, phases as of `now`. */
export async function listTanks(actor: Actor, query: TankListQuery, now = new Date()): Promise<TankList> {
  const statements = listStatementsFor({
    client: actor.role === 'client',
    status: Boolean(query.status),
    clientId: Boolean(query.clientId),
    stage: query.stage === 'complete' ? 'complete' : query.stage ? 'key' : 'none',
    q: Boolean(query.q),
    sort: query.sort,
    dir: query.dir,
  })
  const values = {
    ...visibleTankValues(actor),
    status: query.status,
    listClientId: query.clientId,
    stage: query.stage,
    pattern: query.q ? `%${query.q.replace(/[%_\\]/g, m => `\\${m}`)}%` : undefined,
  }
  const page = () => statements.page.all({ ...values, limit: query.pageSize, offset: (query.page - 1) * query.pageSize })
  let rows = page()
  // A phase time alone has changed is made again before the page is shown.
  if (await refreshStaleVerdicts(now, rows.map(r => r.tank.id)) > 0) rows = page()
  // One row per tank, the forecast kept with its verdict: never the tanks' histories.
  const forecasts = storedForecasts(useDB(), rows.map(r => r.tank.id))
  const total = statements.count.get(values)?.n ?? 0
  return { items: rows.map(row => withForecast(toSummary(row), forecasts.get(row.tank.id))), total, page: query.page, pageSize: query.pageSize }
}

/** The statements behind getTankView, prepared once: the scoped tank row, and its stages' data for the net volume. */
const tankViewStatements = preparedPerDb(() => ({
  staff: baseQuery().where(and(eq(tanks.id, sql.placeholder('tankId')), visibleTankPlaceholders.staff)).prepare(),
  client: baseQuery().where(and(eq(tanks.id, sql.placeholder('tankId')), visibleTankPlaceholders.client)).prepare(),
  stageData: useDB().select({ key: planStages.key, data: planStages.data }).from(planStages).where(eq(planStages.tankId, sql.placeholder('tankId'))).prepare(),
}))

/** The full view of one tank (its phase as of `now`), or undefined when the actor may not see it. */
export async function getTankView(actor: Actor, tankId: string, now = new Date()): Promise<TankView | undefined> {
  const statements = tankViewStatements(useDB())
  const one = () => preparedFor(actor, statements).get({ tankId, ...visibleTankValues(actor) })
  let row = one()
  if (!row) return undefined
  if (await refreshStaleVerdicts(now, [tankId]) > 0) row = one() ?? row
  const t = row.tank
  return {
    ...toSummary(row),
    shape: t.shape,
    siteId: t.siteId,
    dimensions: { ...t.dimensions },
    sumpLitres: t.sumpLitres,
    material: t.material,
    waterSource: t.waterSource,
    aquaristId: t.aquaristId,
    supervisorId: t.supervisorId,
    supervisorName: row.supervisorName,
    kitBasis: t.kitBasis,
    netWaterLitres: netWaterLitres(t, statements.stageData.all({ tankId: t.id })),
    createdAt: t.createdAt,
  }
}
