/**
 * Tidewright's database schema. Values are stored canonical (SI, mg/L as N, practical
 * salinity, degrees C); what a user typed is kept beside them in JSON where it matters.
 * Times are ISO-8601 UTC strings so they sort as text and feed the rule engine unchanged.
 */
import { sql } from 'drizzle-orm'
import { index, integer, primaryKey, real, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core'
import type { CycleInput, Verdict } from '../../shared/cycle/types'
import type { CycleForecast } from '../../shared/cycle/forecast/types'
import type { StoredOrganisationSettings } from '../../shared/schemas/settings'
import type { SignOffSnapshot } from '../../shared/types/sign-off'

import {
  ALERT_STATUSES, AUTH_TOKEN_PURPOSES, CYCLE_METHODS, CYCLE_PHASES, EVENT_KINDS, LIVESTOCK_GROUPS, MAIL_STATUSES, ROLES, SIGN_OFF_STATUSES,
  SALINITY_MODES, STAGE_STATUSES, TANK_MATERIALS, TANK_SHAPES, TANK_STATUSES, UNIT_SYSTEMS, WATER_SOURCES,
  type AmmoniaBasis, type NitrateBasis, type NitriteBasis,
} from '../../shared/vocabulary'

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
  /** Company settings; read only through readOrganisationSettings (shared/schemas/settings.ts fills defaults). */
  settings: text('settings', { mode: 'json' }).$type<StoredOrganisationSettings>().notNull().default(sql`'{}'`),
  /** Bumped by every save of the settings, so a form loaded before someone else's save is refused instead of overwriting it. */
  settingsVersion: integer('settings_version').notNull().default(0),
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
  ammonia: AmmoniaBasis
  nitrite: NitriteBasis
  nitrate: NitrateBasis
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
  material: text('material', { enum: TANK_MATERIALS }).notNull().default('glass'),
  waterSource: text('water_source', { enum: WATER_SOURCES }).notNull().default('mixed'),
  cycleMethod: text('cycle_method', { enum: CYCLE_METHODS }).notNull().default('fishless'),
  status: text('status', { enum: TANK_STATUSES }).notNull().default('planned'),
  aquaristId: text('aquarist_id').references(() => users.id, { onDelete: 'set null' }),
  supervisorId: text('supervisor_id').references(() => users.id, { onDelete: 'set null' }),
  cycleStartedAt: text('cycle_started_at'),
  /** Hour of day (0-23, the client's local time) the client usually tests; drives reminders. */
  usualTestHour: integer('usual_test_hour'),
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
  /** For CSV imports: a hash of the source row, so re-importing a file adds nothing twice. */
  importKey: text('import_key'),
  ...timestamps,
}, t => [
  // In the order a tank's history is read (taken, then entered, then row order: an index ends with
  // the rowid): the engine's read of 100,000 imported tests walks it and sorts nothing.
  index('readings_tank_taken').on(t.tankId, t.takenAt, t.createdAt),
  uniqueIndex('readings_tank_import_key').on(t.tankId, t.importKey),
  // One correction per row: the current value is never in doubt, even for two corrections at once.
  uniqueIndex('readings_corrects_unique').on(t.correctsId),
])

export const events = sqliteTable('events', {
  id: id(),
  tankId: text('tank_id').notNull().references(() => tanks.id, { onDelete: 'cascade' }),
  at: text('at').notNull(),
  kind: text('kind', { enum: EVENT_KINDS }).notNull(),
  /** Dose in mg/L as N added, water change in litres, livestock count... by kind. */
  amount: real('amount'),
  group: text('group', { enum: LIVESTOCK_GROUPS }),
  notes: text('notes'),
  enteredBy: text('entered_by').references(() => users.id, { onDelete: 'set null' }),
  correctsId: text('corrects_id'),
  correctionReason: text('correction_reason'),
  ...timestamps,
}, t => [index('events_tank_at').on(t.tankId, t.at), uniqueIndex('events_corrects_unique').on(t.correctsId)])

/** The engine's current verdict per tank, stored so lists read it without recomputing. */
export const tankVerdicts = sqliteTable('tank_verdicts', {
  tankId: text('tank_id').primaryKey().references(() => tanks.id, { onDelete: 'cascade' }),
  phase: text('phase', { enum: CYCLE_PHASES }).notNull(),
  verdict: text('verdict', { mode: 'json' }).$type<Verdict>().notNull(),
  ruleSetVersion: text('rule_set_version').notNull(),
  evaluatedAt: text('evaluated_at').notNull(),
  /** Set when the company's thresholds changed after this verdict was made: it is made again in batches, or when read. */
  stale: integer('stale', { mode: 'boolean' }).notNull().default(false),
  /** The phase when the last threshold change marked this verdict stale: the settings page counts the tanks whose phase changed. */
  phaseBeforeReevaluation: text('phase_before_reevaluation', { enum: CYCLE_PHASES }),
  /** The completion forecast made with this verdict, from the same input at the same time: lists read it instead of the tank's history. */
  forecast: text('forecast', { mode: 'json' }).$type<CycleForecast>(),
})

/**
 * How many times each tank's readings or events have changed, on any connection: triggers on
 * `readings` and `events` (migration 0010) count every insert, update and delete, so a copy of
 * the engine's input kept in memory knows whether it still matches the database
 * (server/domain/readings/engine-input-cache.ts). No foreign key: a tank's rows deleted with the
 * tank still count, and the counter of a tank that is gone is never read.
 */
export const tankDataRevisions = sqliteTable('tank_data_revisions', {
  tankId: text('tank_id').primaryKey(),
  revision: integer('revision').notNull(),
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

/**
 * A signed-in browser. The sealed cookie carries only a random token; the row keeps its
 * SHA-256, so neither a copied database nor the person's own session list can rebuild a
 * cookie. Ended rows stay (with why) until the housekeeping prunes them.
 */
export const sessions = sqliteTable('sessions', {
  id: id(),
  userId: text('user_id').notNull().references(() => users.id, { onDelete: 'cascade' }),
  tokenHash: text('token_hash').notNull(),
  createdAt: text('created_at').notNull(),
  lastSeenAt: text('last_seen_at').notNull(),
  expiresAt: text('expires_at').notNull(),
  /** A short description of the browser, for the person's own list of sessions. */
  userAgent: text('user_agent'),
  address: text('address'),
  endedAt: text('ended_at'),
  endReason: text('end_reason'),
}, t => [uniqueIndex('sessions_token_hash').on(t.tokenHash), index('sessions_user_idx').on(t.userId, t.endedAt)])

/** One attempt counted by a throttle (sign-in, reset and invitation mail), by key and time. */
export const throttleMarks = sqliteTable('throttle_marks', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  key: text('key').notNull(),
  at: text('at').notNull(),
}, t => [index('throttle_marks_key_at').on(t.key, t.at)])

/** The company's build-plan template, one row per stage; new tanks copy it. */
export const planTemplateStages = sqliteTable('plan_template_stages', {
  id: id(),
  organisationId: text('organisation_id').notNull().references(() => organisations.id, { onDelete: 'cascade' }),
  position: integer('position').notNull(),
  key: text('key').notNull(),
  title: text('title').notNull(),
  checklist: text('checklist', { mode: 'json' }).$type<string[]>().notNull().default(sql`'[]'`),
  ...timestamps,
}, t => [uniqueIndex('plan_template_org_position').on(t.organisationId, t.position)])

/** A stored file (photo or PDF). Bytes live in Nitro storage under `storageKey`, never at a public path. */
export const uploads = sqliteTable('uploads', {
  id: id(),
  organisationId: text('organisation_id').notNull().references(() => organisations.id, { onDelete: 'cascade' }),
  tankId: text('tank_id').notNull().references(() => tanks.id, { onDelete: 'cascade' }),
  stageId: text('stage_id').references(() => planStages.id, { onDelete: 'set null' }),
  readingId: text('reading_id').references(() => readings.id, { onDelete: 'set null' }),
  /** Detected from the bytes (magic numbers), not from the file name. */
  mimeType: text('mime_type').notNull(),
  sizeBytes: integer('size_bytes').notNull(),
  originalName: text('original_name').notNull(),
  storageKey: text('storage_key').notNull(),
  thumbnailKey: text('thumbnail_key'),
  uploadedBy: text('uploaded_by').references(() => users.id, { onDelete: 'set null' }),
  ...timestamps,
}, t => [index('uploads_tank_idx').on(t.tankId), index('uploads_stage_idx').on(t.stageId)])

/** One open alert per tank and kind; readings that raise or clear it are recorded. */
export const alerts = sqliteTable('alerts', {
  id: id(),
  organisationId: text('organisation_id').notNull().references(() => organisations.id, { onDelete: 'cascade' }),
  tankId: text('tank_id').notNull().references(() => tanks.id, { onDelete: 'cascade' }),
  /** The rule id of the danger finding that opened it. */
  kind: text('kind').notNull(),
  status: text('status', { enum: ALERT_STATUSES }).notNull().default('open'),
  message: text('message').notNull(),
  openedByReadingId: text('opened_by_reading_id').references(() => readings.id, { onDelete: 'set null' }),
  lastReadingId: text('last_reading_id').references(() => readings.id, { onDelete: 'set null' }),
  detail: text('detail', { mode: 'json' }).$type<Record<string, unknown>>().notNull().default(sql`'{}'`),
  openedAt: text('opened_at').notNull(),
  acknowledgedAt: text('acknowledged_at'),
  acknowledgedBy: text('acknowledged_by').references(() => users.id, { onDelete: 'set null' }),
  acknowledgeNote: text('acknowledge_note'),
  escalatedAt: text('escalated_at'),
  resolvedAt: text('resolved_at'),
  resolvedBy: text('resolved_by').references(() => users.id, { onDelete: 'set null' }),
  resolveNote: text('resolve_note'),
  /** Set while status is not resolved, so the unique index allows one open alert per kind. */
  openKey: text('open_key'),
  ...timestamps,
}, t => [
  uniqueIndex('alerts_one_open_per_kind').on(t.openKey),
  index('alerts_tank_idx').on(t.tankId),
  index('alerts_org_status_idx').on(t.organisationId, t.status),
])

/** In-app notices for one user. */
export const notifications = sqliteTable('notifications', {
  id: id(),
  userId: text('user_id').notNull().references(() => users.id, { onDelete: 'cascade' }),
  organisationId: text('organisation_id').notNull().references(() => organisations.id, { onDelete: 'cascade' }),
  kind: text('kind').notNull(),
  title: text('title').notNull(),
  body: text('body').notNull(),
  link: text('link'),
  alertId: text('alert_id').references(() => alerts.id, { onDelete: 'set null' }),
  readAt: text('read_at'),
  ...timestamps,
}, t => [index('notifications_user_read_idx').on(t.userId, t.readAt)])

/** Transactional outbox: e-mail rows written with the change that caused them, delivered by a worker. */
export const mailOutbox = sqliteTable('mail_outbox', {
  id: id(),
  organisationId: text('organisation_id'),
  toAddress: text('to_address').notNull(),
  subject: text('subject').notNull(),
  textBody: text('text_body').notNull(),
  htmlBody: text('html_body'),
  kind: text('kind').notNull(),
  /** Stable id sent as Message-ID so a retried delivery can be recognised downstream. */
  messageId: text('message_id').notNull(),
  status: text('status', { enum: MAIL_STATUSES }).notNull().default('pending'),
  attempts: integer('attempts').notNull().default(0),
  nextAttemptAt: text('next_attempt_at').notNull().$defaultFn(now),
  lastError: text('last_error'),
  sentAt: text('sent_at'),
  ...timestamps,
}, t => [index('mail_outbox_due_idx').on(t.status, t.nextAttemptAt), uniqueIndex('mail_outbox_message_id').on(t.messageId)])

/** Single-use links: invitations and password resets. Only a hash of the token is stored. */
export const authTokens = sqliteTable('auth_tokens', {
  id: id(),
  userId: text('user_id').notNull().references(() => users.id, { onDelete: 'cascade' }),
  purpose: text('purpose', { enum: AUTH_TOKEN_PURPOSES }).notNull(),
  tokenHash: text('token_hash').notNull(),
  expiresAt: text('expires_at').notNull(),
  usedAt: text('used_at'),
  ...timestamps,
}, t => [uniqueIndex('auth_tokens_hash').on(t.tokenHash)])

/**
 * How one person measures one tank's salinity (the instrument's mode and, for a hydrometer or
 * refractometer, its scale), so the daily form opens that way on every device they test from:
 * a client may test on a phone and a laptop, and one tank may take a refractometer, another a
 * hydrometer. Kept per person because the instrument is in the hands of whoever tests.
 */
export const salinityInstruments = sqliteTable('salinity_instruments', {
  userId: text('user_id').notNull().references(() => users.id, { onDelete: 'cascade' }),
  tankId: text('tank_id').notNull().references(() => tanks.id, { onDelete: 'cascade' }),
  mode: text('mode', { enum: SALINITY_MODES }).notNull(),
  /** The scale printed on a hydrometer or refractometer (a key of SG_BASES); kept for the other modes too, so switching back finds it. */
  sgBasis: text('sg_basis').notNull(),
  ...timestamps,
}, t => [
  primaryKey({ columns: [t.userId, t.tankId] }),
  index('salinity_instruments_tank_idx').on(t.tankId),
])

/** Which notices reach a user by e-mail; danger alerts to the assigned aquarist always do. */
export const notificationPreferences = sqliteTable('notification_preferences', {
  userId: text('user_id').primaryKey().references(() => users.id, { onDelete: 'cascade' }),
  emailKinds: text('email_kinds', { mode: 'json' }).$type<Record<string, boolean>>().notNull().default(sql`'{}'`),
  ...timestamps,
})

/** A supervisor's decision on a tank's cycle, with the verdict it was made against. Never rewritten. */
export const signOffs = sqliteTable('sign_offs', {
  id: id(),
  organisationId: text('organisation_id').notNull().references(() => organisations.id, { onDelete: 'cascade' }),
  tankId: text('tank_id').notNull().references(() => tanks.id, { onDelete: 'cascade' }),
  requestedBy: text('requested_by').references(() => users.id, { onDelete: 'set null' }),
  requestedAt: text('requested_at').notNull(),
  requestNote: text('request_note'),
  status: text('status', { enum: SIGN_OFF_STATUSES }).notNull().default('requested'),
  decidedBy: text('decided_by').references(() => users.id, { onDelete: 'set null' }),
  decidedAt: text('decided_at'),
  decisionNote: text('decision_note'),
  /** True when approved against the engine's verdict; a written reason is then required. */
  override: integer('override', { mode: 'boolean' }).notNull().default(false),
  /** The engine's verdict at decision time and the tank as signed; its input is in sign_off_inputs. */
  snapshot: text('snapshot', { mode: 'json' }).$type<SignOffSnapshot>(),
  ruleSetVersion: text('rule_set_version'),
  verificationCode: text('verification_code'),
  reopenedBy: text('reopened_by').references(() => users.id, { onDelete: 'set null' }),
  reopenedAt: text('reopened_at'),
  reopenReason: text('reopen_reason'),
  ...timestamps,
}, t => [index('sign_offs_tank_idx').on(t.tankId), uniqueIndex('sign_offs_verification').on(t.verificationCode)])

/**
 * The engine input a decision was made from (every test and event of the tank as of the decision),
 * kept apart from `sign_offs.snapshot`: for an imported history it is tens of MB of JSON, which
 * the sign-off reads (the review queue, the tank page, the evidence, the lock of every save on a
 * signed tank) must not parse. Read only for what needs it: the certificate's final tests (in the
 * heavy-work pool); the lock asks the ids it holds, recorded beside it (`sign_off_input_entries`).
 * Written with the decision, in its transaction; never rewritten.
 */
export const signOffInputs = sqliteTable('sign_off_inputs', {
  signOffId: text('sign_off_id').primaryKey().references(() => signOffs.id, { onDelete: 'cascade' }),
  input: text('input', { mode: 'json' }).$type<CycleInput>().notNull(),
})

/**
 * The tests and events a decision's engine input holds, one row each: the lock asks whether an
 * entry is in the signed record (`signedInputHolds`) by this key, not by reading the input, which
 * for an imported history is tens of MB of JSON on the request loop. Written with the input, in
 * the decision's transaction (`recordSignedInput`); for decisions stored before it, filled once
 * from their stored input by migration 0013. Never rewritten. WITHOUT ROWID in that migration:
 * the key is the whole row, so the table is its own index.
 */
export const signOffInputEntries = sqliteTable('sign_off_input_entries', {
  signOffId: text('sign_off_id').notNull().references(() => signOffs.id, { onDelete: 'cascade' }),
  /** A reading's or an event's id, as the input holds it. */
  entryId: text('entry_id').notNull(),
}, t => [primaryKey({ columns: [t.signOffId, t.entryId] })])

/**
 * A change to a signed-off tank's facts (name, volume, method, dimensions, client, site)
 * made without reopening the sign-off: a written reason, who and when, before and after.
 * The certificate lists every amendment under the facts it was signed with. Never rewritten.
 */
export const signOffAmendments = sqliteTable('sign_off_amendments', {
  id: id(),
  signOffId: text('sign_off_id').notNull().references(() => signOffs.id, { onDelete: 'cascade' }),
  tankId: text('tank_id').notNull().references(() => tanks.id, { onDelete: 'cascade' }),
  amendedBy: text('amended_by').references(() => users.id, { onDelete: 'set null' }),
  amendedAt: text('amended_at').notNull(),
  reason: text('reason').notNull(),
  changes: text('changes', { mode: 'json' }).$type<{ field: string, before: unknown, after: unknown }[]>().notNull(),
}, t => [index('sign_off_amendments_sign_off_idx').on(t.signOffId)])
