/**
 * Tidewright's database schema. Values are stored canonical (SI, mg/L as N, practical
 * salinity, degrees C); what a user typed is kept beside them in JSON where it matters.
 * Times are ISO-8601 UTC strings so they sort as text and feed the rule engine unchanged.
 */
import { sql } from 'drizzle-orm'
import { index, integer, real, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core'

export const ROLES = ['admin', 'aquarist', 'supervisor', 'client'] as const
export const TANK_STATUSES = ['planned', 'building', 'cycling', 'cycled', 'signed-off', 'stocking'] as const
export const TANK_SHAPES = ['rectangular', 'cube', 'cylinder', 'bow-front', 'corner', 'hexagonal'] as const
export const CYCLE_METHODS = ['fishless', 'fish-in'] as const
export const STAGE_STATUSES = ['not-started', 'in-progress', 'done', 'skipped'] as const
export const EVENT_KINDS = ['ammonia-dose', 'bacteria-dose', 'water-change', 'livestock-added', 'lighting-change', 'note'] as const
export const UNIT_SYSTEMS = ['us', 'metric'] as const

const id = () => text('id').primaryKey().$defaultFn(() => crypto.randomUUID())
const now = () => new Date().toISOString()
const timestamps = {
  createdAt: text('created_at').notNull().$defaultFn(now),
  updatedAt: text('updated_at').notNull().$defaultFn(now).$onUpdateFn(now),
}

/** A company account: the tenant. Nobody sees another organisation's rows. */
export const organisations = sqliteTable('organisations', {
  id: id(),
  name: text('name').notNull(),
  /** Company defaults: threshold overrides, default units, alert delays. */
  settings: text('settings', { mode: 'json' }).$type<Record<string, unknown>>().notNull().default(sql`'{}'`),
  ...timestamps,
})

/** A client record; it may exist without a sign-in account. */
export const clients = sqliteTable('clients', {
  id: id(),
  organisationId: text('organisation_id').notNull().references(() => organisations.id, { onDelete: 'cascade' }),
  name: text('name').notNull(),
  email: text('email'),
  phone: text('phone'),
  notes: text('notes'),
  archivedAt: text('archived_at'),
  ...timestamps,
}, t => [index('clients_org_idx').on(t.organisationId)])

export const users = sqliteTable('users', {
  id: id(),
  organisationId: text('organisation_id').notNull().references(() => organisations.id, { onDelete: 'cascade' }),
  email: text('email').notNull(),
  name: text('name').notNull(),
  role: text('role', { enum: ROLES }).notNull(),
  /** Null until an invited user sets a password. */
  passwordHash: text('password_hash'),
  units: text('units', { enum: UNIT_SYSTEMS }).notNull().default('metric'),
  /** For role `client`: the client record whose tanks this account may see. */
  clientId: text('client_id').references(() => clients.id, { onDelete: 'set null' }),
  active: integer('active', { mode: 'boolean' }).notNull().default(true),
  ...timestamps,
}, t => [
  uniqueIndex('users_email_unique').on(t.email),
  index('users_org_idx').on(t.organisationId),
])

/** Where a client's tanks stand: a home or an office. */
export const sites = sqliteTable('sites', {
  id: id(),
  organisationId: text('organisation_id').notNull().references(() => organisations.id, { onDelete: 'cascade' }),
  clientId: text('client_id').notNull().references(() => clients.id, { onDelete: 'cascade' }),
  label: text('label').notNull(),
  address: text('address'),
  roomNotes: text('room_notes'),
  accessNotes: text('access_notes'),
  archivedAt: text('archived_at'),
  ...timestamps,
}, t => [index('sites_client_idx').on(t.clientId)])

/** Inside dimensions in millimetres; which fields apply depends on the shape. */
export interface TankDimensions {
  lengthMm?: number
  widthMm?: number
  heightMm?: number
  diameterMm?: number
  radiusMm?: number
  sideMm?: number
  bowDepthMm?: number
}

/** How the client's test kits report nitrogen compounds; remembered per tank. */
export interface KitBasis {
  ammonia: 'NH3' | 'NH4' | 'N'
  nitrite: 'NO2' | 'N'
  nitrate: 'NO3' | 'N'
}

export const tanks = sqliteTable('tanks', {
  id: id(),
  organisationId: text('organisation_id').notNull().references(() => organisations.id, { onDelete: 'cascade' }),
  clientId: text('client_id').notNull().references(() => clients.id, { onDelete: 'restrict' }),
  siteId: text('site_id').references(() => sites.id, { onDelete: 'set null' }),
  name: text('name').notNull(),
  shape: text('shape', { enum: TANK_SHAPES }).notNull().default('rectangular'),
  dimensions: text('dimensions', { mode: 'json' }).$type<TankDimensions>().notNull().default(sql`'{}'`),
  volumeLitres: real('volume_litres').notNull(),
  sumpLitres: real('sump_litres').notNull().default(0),
  material: text('material', { enum: ['glass', 'acrylic'] }).notNull().default('glass'),
  waterSource: text('water_source', { enum: ['natural', 'mixed'] }).notNull().default('mixed'),
  cycleMethod: text('cycle_method', { enum: CYCLE_METHODS }).notNull().default('fishless'),
  status: text('status', { enum: TANK_STATUSES }).notNull().default('planned'),
  aquaristId: text('aquarist_id').references(() => users.id, { onDelete: 'set null' }),
  supervisorId: text('supervisor_id').references(() => users.id, { onDelete: 'set null' }),
  cycleStartedAt: text('cycle_started_at'),
  kitBasis: text('kit_basis', { mode: 'json' }).$type<KitBasis>().notNull()
    .default(sql`'{"ammonia":"NH3","nitrite":"NO2","nitrate":"NO3"}'`),
  archivedAt: text('archived_at'),
  ...timestamps,
}, t => [
  index('tanks_org_idx').on(t.organisationId),
  index('tanks_client_idx').on(t.clientId),
  index('tanks_aquarist_idx').on(t.aquaristId),
])

export interface ChecklistItem {
  id: string
  label: string
  done: boolean
  doneBy?: string | null
  doneAt?: string | null
}

/** One stage of a tank's own build plan (copied from the company template). */
export const planStages = sqliteTable('plan_stages', {
  id: id(),
  tankId: text('tank_id').notNull().references(() => tanks.id, { onDelete: 'cascade' }),
  position: integer('position').notNull(),
  key: text('key').notNull(),
  title: text('title').notNull(),
  status: text('status', { enum: STAGE_STATUSES }).notNull().default('not-started'),
  skipReason: text('skip_reason'),
  checklist: text('checklist', { mode: 'json' }).$type<ChecklistItem[]>().notNull().default(sql`'[]'`),
  notes: text('notes'),
  /** Stage-specific values: leak-test times, substrate depth, salt target... */
  data: text('data', { mode: 'json' }).$type<Record<string, unknown>>().notNull().default(sql`'{}'`),
  completedBy: text('completed_by').references(() => users.id, { onDelete: 'set null' }),
  completedAt: text('completed_at'),
  ...timestamps,
}, t => [uniqueIndex('plan_stages_tank_position').on(t.tankId, t.position)])

/** One test session. Canonical values; `entered` keeps what was typed and in which basis. */
export const readings = sqliteTable('readings', {
  id: id(),
  tankId: text('tank_id').notNull().references(() => tanks.id, { onDelete: 'cascade' }),
  takenAt: text('taken_at').notNull(),
  enteredBy: text('entered_by').references(() => users.id, { onDelete: 'set null' }),
  ammoniaN: real('ammonia_n'),
  nitriteN: real('nitrite_n'),
  nitrateN: real('nitrate_n'),
  pH: real('ph'),
  temperatureC: real('temperature_c'),
  salinity: real('salinity'),
  alkalinityDkh: real('alkalinity_dkh'),
  calciumMgL: real('calcium_mg_l'),
  magnesiumMgL: real('magnesium_mg_l'),
  phosphateMgL: real('phosphate_mg_l'),
  notes: text('notes'),
  entered: text('entered', { mode: 'json' }).$type<Record<string, unknown>>().notNull().default(sql`'{}'`),
  /** A correction after sign-off is a new row pointing at the one it corrects. */
  correctsId: text('corrects_id'),
  correctionReason: text('correction_reason'),
  ...timestamps,
}, t => [index('readings_tank_taken').on(t.tankId, t.takenAt)])

export const events = sqliteTable('events', {
  id: id(),
  tankId: text('tank_id').notNull().references(() => tanks.id, { onDelete: 'cascade' }),
  at: text('at').notNull(),
  kind: text('kind', { enum: EVENT_KINDS }).notNull(),
  /** Dose in mg/L as N added, water change in litres, livestock count... by kind. */
  amount: real('amount'),
  group: text('group'),
  notes: text('notes'),
  enteredBy: text('entered_by').references(() => users.id, { onDelete: 'set null' }),
  ...timestamps,
}, t => [index('events_tank_at').on(t.tankId, t.at)])

/** The engine's current verdict per tank, stored so lists read it without recomputing. */
export const tankVerdicts = sqliteTable('tank_verdicts', {
  tankId: text('tank_id').primaryKey().references(() => tanks.id, { onDelete: 'cascade' }),
  phase: text('phase').notNull(),
  verdict: text('verdict', { mode: 'json' }).$type<Record<string, unknown>>().notNull(),
  ruleSetVersion: text('rule_set_version').notNull(),
  evaluatedAt: text('evaluated_at').notNull(),
})

/** Who changed what: append-only by design. */
export const auditLog = sqliteTable('audit_log', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  organisationId: text('organisation_id').notNull(),
  actorId: text('actor_id'),
  action: text('action').notNull(),
  entity: text('entity').notNull(),
  entityId: text('entity_id'),
  before: text('before', { mode: 'json' }),
  after: text('after', { mode: 'json' }),
  at: text('at').notNull().$defaultFn(now),
}, t => [index('audit_org_at').on(t.organisationId, t.at)])

/** Failed sign-ins, for throttling; keyed by normalised e-mail and by client address. */
export const signInFailures = sqliteTable('sign_in_failures', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  key: text('key').notNull(),
  at: text('at').notNull(),
}, t => [index('sign_in_failures_key_at').on(t.key, t.at)])
