/**
 * The access matrix: one entry per API route, keyed `METHOD /api/path` exactly as the
 * file under server/api names it (`tanks/[id].patch.ts` -> `PATCH /api/tanks/[id]`).
 * tests/api/access-matrix.test.ts fails for a route file without an entry here, and for
 * an entry without a route file. It calls each route as every persona below and checks
 * the status is exactly the one written here, and that no response ever carries data of
 * a tank, client, user or company the persona may not see. tests/api/fuzz.test.ts sends
 * random and hostile bodies to every entry with a `fuzz` field (required for POST, PUT
 * and PATCH routes).
 *
 * The demo ids: `f.demo.tanks.lounge` belongs to client@ (the `client` persona);
 * client2@ (`otherClient`) is a client of the same company who must not see it;
 * aquarist@other-company.test (`otherCompany`) is staff of an unrelated company.
 */
import * as v from 'valibot'
import type { GenericSchema } from 'valibot'
import { DEFAULT_PLAN_TEMPLATE } from '../../shared/plan/default-template'
import { LoginSchema } from '../../shared/schemas/auth'
import { AlertAcknowledgeSchema, AlertResolveSchema } from '../../shared/schemas/alerts'
import { ForgotPasswordSchema, InvitationSchema, SetPasswordSchema, UnitsPreferenceSchema } from '../../shared/schemas/account'
import { CompanySettingsUpdateSchema, DEFAULT_ORGANISATION_SETTINGS } from '../../shared/schemas/settings'
import { NotificationPreferencesSchema } from '../../shared/schemas/notifications'
import { PersonRoleSchema } from '../../shared/schemas/people'
import { EventCorrectionSchema, ReadingCorrectionSchema, SignOffDecisionSchema, SignOffReopenSchema, SignOffRequestSchema, StartStockingSchema } from '../../shared/schemas/sign-off'
import { ClientCreateSchema, ClientPatchSchema, SiteCreateSchema, SitePatchSchema } from '../../shared/schemas/clients'
import { PlanTemplateSchema, StagePatchSchema } from '../../shared/schemas/plan'
import { EventInputSchema, EventPatchSchema, ReadingImportSchema, ReadingInputSchema, ReadingPatchSchema } from '../../shared/schemas/reading'
import { SalinityInstrumentSchema } from '../../shared/schemas/salinity-instrument'
import { TankCreateSchema, TankPatchSchema } from '../../shared/schemas/tanks'
import type { Fixtures } from '../support/fixtures'
import type { ApiClient } from '../support/http'

export const PERSONAS = ['signedOut', 'admin', 'aquarist', 'supervisor', 'client', 'otherClient', 'otherCompany'] as const
export type Persona = (typeof PERSONAS)[number]

/** Sign-in e-mail per persona (password `tidewright-demo`). */
export const PERSONA_EMAIL: Record<Exclude<Persona, 'signedOut'>, string> = {
  admin: 'admin@tidewright.test',
  aquarist: 'aquarist@tidewright.test',
  supervisor: 'supervisor@tidewright.test',
  client: 'client@tidewright.test',
  otherClient: 'client2@tidewright.test',
  otherCompany: 'aquarist@other-company.test',
}

export type Expectations = Record<Persona, number>

/** How the fuzz test attacks a route's body. */
export type FuzzPlan
  = | 'no-body' // the route reads no body: any body must still never cause a 5xx
    | {
    /** Who sends the hostile bodies (someone allowed to use the route). */
      as: Exclude<Persona, 'signedOut'>
      /** The valibot schema the handler validates the body with: a body it rejects must get a 4xx and change nothing. */
      schema: GenericSchema
      /** A body the route accepts, mutated field by field by the fuzzer. */
      validBody: (c: MatrixContext) => Record<string, unknown> | Promise<Record<string, unknown>>
      /** Keep accepted fuzz bodies from reaching the route (e.g. sign-in, where accepted bodies feed the throttle). */
      onlyRejected?: boolean
    }
  /** A multipart upload route: the fuzzer sends wrong, lying, empty, oversize and oddly named files. */
    | { upload: true, as: Exclude<Persona, 'signedOut'> }

/** What a matrix entry may use to build its request: the ids, signed-in sessions, the database (read-only). */
export interface MatrixContext {
  f: Fixtures
  /** A session of the persona, signed in once and reused. */
  as: (persona: Exclude<Persona, 'signedOut'>) => Promise<ApiClient>
  /** A read-only query on the test database. */
  query: <T = Record<string, unknown>>(sql: string, ...params: unknown[]) => T[]
  /** A write on the test database, only for rows no route can make on demand (an open alert, a notice). */
  run: (sql: string, ...params: unknown[]) => void
}

export interface MatrixEntry {
  /** The concrete URL to call, normally a resource of the `client` persona's tank. May create what it needs first (called before each persona's call). */
  url: (c: MatrixContext) => string | Promise<string>
  /** Methods to call for an ANY route (a file without a method suffix). */
  methods?: string[]
  body?: (c: MatrixContext) => unknown
  expect: Expectations
  /** The call ends or replaces the session: each persona signs in afresh for it. */
  freshSession?: boolean
  /** A server-sent event stream: only the status and headers are read, then the call is closed. */
  stream?: boolean
  /** What the route shows every persona by design (e.g. a public certificate check): not counted as a leak. */
  discloses?: (c: MatrixContext) => string[]
  fuzz?: FuzzPlan
}

/** Everyone signed in gets `ok`, signed out 401. */
export function anySignedIn(ok = 200): Expectations {
  return { signedOut: 401, admin: ok, aquarist: ok, supervisor: ok, client: ok, otherClient: ok, otherCompany: ok }
}
/** Reading a resource of the `client` persona's tank: outsiders get 404. */
export function tankReader(ok = 200): Expectations {
  return { signedOut: 401, admin: ok, aquarist: ok, supervisor: ok, client: ok, otherClient: 404, otherCompany: 404 }
}
/** Staff only (admin, aquarist, supervisor): clients 403, another company's staff 404. */
export function staffOnTank(ok = 200): Expectations {
  return { signedOut: 401, admin: ok, aquarist: ok, supervisor: ok, client: 403, otherClient: 403, otherCompany: 404 }
}
/** Admins and aquarists change a tank: supervisors and clients 403, another company's aquarist 404. */
export function tankManager(ok = 200): Expectations {
  return { signedOut: 401, admin: ok, aquarist: ok, supervisor: 403, client: 403, otherClient: 403, otherCompany: 404 }
}
/** The same status for every persona. */
export function everyone(status: number): Expectations {
  return { signedOut: status, admin: status, aquarist: status, supervisor: status, client: status, otherClient: status, otherCompany: status }
}

/** Clients may not use staff routes (403); another company's staff see their own data only. */
export function staffList(ok = 200): Expectations {
  return { signedOut: 401, admin: ok, aquarist: ok, supervisor: ok, client: 403, otherClient: 403, otherCompany: ok }
}
/** Admins and aquarists change company records; the other company's aquarist may not reach ours (404). */
export function recordManager(ok = 200): Expectations {
  return { signedOut: 401, admin: ok, aquarist: ok, supervisor: 403, client: 403, otherClient: 403, otherCompany: 404 }
}
/** Entering readings and events on the `client` persona's tank: staff who manage it and the client. */
export function tankEntry(ok = 201): Expectations {
  return { signedOut: 401, admin: ok, aquarist: ok, supervisor: 403, client: ok, otherClient: 404, otherCompany: 404 }
}

/** The body of the archive routes (the schema is private to those route files; this mirrors it). */
const ARCHIVE_BODY = v.object({ archived: v.optional(v.boolean(), true) })

const hoursAgo = (h: number) => new Date(Date.now() - h * 3_600_000).toISOString()

/** A reading as the entry form sends it (values from the readings API tests). */
export const READING_BODY = () => ({
  takenAt: hoursAgo(1), ammonia: 0.25, nitrite: 0.5, nitrate: 10,
  basis: { ammonia: 'NH3', nitrite: 'NO2', nitrate: 'NO3' },
  pH: 8.1, temperature: 25, temperatureUnit: 'C', salinity: 35, salinityMode: 'practical',
})
const EVENT_BODY = () => ({ at: hoursAgo(1), kind: 'note', notes: 'Access matrix note' })

const firstStage = (c: MatrixContext) => c.query<{ id: string }>('select id from plan_stages where tank_id = ? order by position limit 1', c.f.demo.tanks.lounge)[0]!.id
const loweSite = (c: MatrixContext) => c.query<{ id: string }>('select id from sites where client_id = ? order by created_at limit 1', c.f.demo.clients.lowe)[0]!.id

/** A fresh reading entered by the tank's client, so each persona edits or deletes its own copy. */
async function freshReading(c: MatrixContext): Promise<string> {
  const response = await (await c.as('client')).post(`/api/tanks/${c.f.demo.tanks.lounge}/readings`, READING_BODY())
  if (response.status !== 201) throw new Error(`could not create a reading: ${response.status}`)
  return response.body.reading.id
}
async function freshEvent(c: MatrixContext): Promise<string> {
  const response = await (await c.as('client')).post(`/api/tanks/${c.f.demo.tanks.lounge}/events`, EVENT_BODY())
  if (response.status !== 201) throw new Error(`could not create an event: ${response.status}`)
  return response.body.id ?? response.body.event?.id
}
async function freshClient(c: MatrixContext): Promise<string> {
  const response = await (await c.as('admin')).post('/api/clients', { name: 'Archive Candidate' })
  if (response.status !== 201) throw new Error(`could not create a client: ${response.status}`)
  return response.body.id
}
async function freshSite(c: MatrixContext): Promise<string> {
  const response = await (await c.as('admin')).post(`/api/clients/${c.f.demo.clients.lowe}/sites`, { label: 'Archive candidate site' })
  if (response.status !== 201) throw new Error(`could not create a site: ${response.status}`)
  return response.body.id
}

/** A minimal valid PDF, the smallest file the upload routes accept without decoding an image. */
export const TINY_PDF = Buffer.from('%PDF-1.4\n1 0 obj<</Type/Catalog/Pages 2 0 R>>endobj\n2 0 obj<</Type/Pages/Kids[]/Count 0>>endobj\ntrailer<</Root 1 0 R>>\n%%EOF\n')
/** A 2 x 2 PNG, as sharp writes it. */
export const TINY_PNG = Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAIAAAACCAIAAAD91JpzAAAACXBIWXMAAAPoAAAD6AG1e1JrAAAAEUlEQVQImWOQy++Sy+9igFAAHOIEXbVKlfUAAAAASUVORK5CYII=', 'base64')

export function fileForm(bytes: Buffer, name: string, type: string): FormData {
  const form = new FormData()
  form.append('file', new Blob([new Uint8Array(bytes)], { type }), name)
  return form
}

const uploadCache = new Map<string, string>()
/** One upload on the lounge tank's first stage (made once per kind, by the admin). */
async function loungeUpload(c: MatrixContext, kind: 'pdf' | 'png'): Promise<string> {
  const cached = uploadCache.get(kind)
  if (cached) return cached
  const form = kind === 'pdf' ? fileForm(TINY_PDF, 'leak-test.pdf', 'application/pdf') : fileForm(TINY_PNG, 'leak-test.png', 'image/png')
  const response = await (await c.as('admin')).request('POST', `/api/tanks/${c.f.demo.tanks.lounge}/stages/${firstStage(c)}/uploads`, form)
  if (response.status !== 201) throw new Error(`could not upload: ${response.status} ${JSON.stringify(response.body)}`)
  uploadCache.set(kind, response.body.id)
  return response.body.id
}

/** A new upload on the lounge tank's first stage, added by the aquarist (for the removal route). */
async function freshStageUpload(c: MatrixContext): Promise<string> {
  const response = await (await c.as('aquarist')).request('POST', `/api/tanks/${c.f.demo.tanks.lounge}/stages/${firstStage(c)}/uploads`, fileForm(TINY_PNG, 'removable.png', 'image/png'))
  if (response.status !== 201) throw new Error(`could not upload: ${response.status} ${JSON.stringify(response.body)}`)
  return response.body.id
}

/** A fresh open alert on the study reef (client3's tank), so each persona acts on its own. */
let alertCounter = 0
function freshAlert(c: MatrixContext): string {
  const id = crypto.randomUUID()
  const now = new Date().toISOString()
  const kind = `matrix-check-${++alertCounter}`
  c.run(`insert into alerts (id, organisation_id, tank_id, kind, status, message, detail, opened_at, open_key, created_at, updated_at)
    values (?, ?, ?, ?, 'open', 'Access matrix alert', '{}', ?, ?, ?, ?)`, id, c.f.demo.organisationId, c.f.demo.tanks.study, kind, now, `${c.f.demo.tanks.study}:${kind}`, now, now)
  return id
}
let personCounter = 0
/** A fresh aquarist of the demo company, so deactivating or moving one never touches a persona. */
function freshPerson(c: MatrixContext): string {
  const id = crypto.randomUUID()
  const now = new Date().toISOString()
  c.run(`insert into users (id, organisation_id, email, name, role, units, active, created_at, updated_at) values (?, ?, ?, 'Matrix Person', 'aquarist', 'metric', 1, ?, ?)`,
    id, c.f.demo.organisationId, `matrix-person-${++personCounter}@tidewright.test`, now, now)
  return id
}
/** A live session of client3@ (no persona): everyone else's attempt to end it is a 404. */
function someoneElsesSession(c: MatrixContext): string {
  const id = `matrix-session-${String(++personCounter).padStart(7, '0')}`
  const now = new Date()
  c.run(`insert into sessions (id, user_id, token_hash, created_at, last_seen_at, expires_at) values (?, ?, ?, ?, ?, ?)`,
    id, c.f.demo.users.client3, `matrix-${id}`, now.toISOString(), now.toISOString(), new Date(now.getTime() + 86_400_000).toISOString())
  return id
}
/** A fresh unread notice for aquarist@ (only its owner may mark it read). */
function freshNotice(c: MatrixContext): string {
  const id = crypto.randomUUID()
  const now = new Date().toISOString()
  c.run(`insert into notifications (id, user_id, organisation_id, kind, title, body, created_at, updated_at) values (?, ?, ?, 'alert', 'Matrix notice', 'Check', ?, ?)`,
    id, c.f.demo.users.aquarist, c.f.demo.organisationId, now, now)
  return id
}
let nanoSigned: Promise<string> | undefined
/** Signs the nano tank (client2's, cycled, awaiting sign-off) off once through the API; returns its verification code. */
function signedOffNano(c: MatrixContext): Promise<string> {
  nanoSigned ??= (async () => {
    const tank = c.f.demo.tanks.nano
    // The demo seed leaves nano awaiting sign-off; ask only if nobody has.
    if (!c.query('select id from sign_offs where tank_id = ? and status = ?', tank, 'requested').length) {
      const asked = await (await c.as('aquarist')).post(`/api/tanks/${tank}/sign-off-requests`, { note: 'Matrix sign-off' })
      if (asked.status !== 201) throw new Error(`sign-off request: ${asked.status} ${JSON.stringify(asked.body)}`)
    }
    const decided = await (await c.as('supervisor')).post(`/api/tanks/${tank}/sign-off/decision`, { decision: 'approve', note: 'Approved for the access matrix' })
    if (decided.status !== 200) throw new Error(`sign-off decision: ${decided.status} ${JSON.stringify(decided.body)}`)
    return c.query<{ code: string }>('select verification_code as code from sign_offs where tank_id = ? and status = ?', tank, 'approved')[0]!.code
  })()
  return nanoSigned
}
let inviteCounter = 0
const UNUSED_TOKEN = 'A'.repeat(43)

/** A fresh staff account that has chosen a password, so a reset link may be sent to it. */
function acceptedPerson(c: MatrixContext): string {
  const id = freshPerson(c)
  c.run(`update users set password_hash = 'not-a-usable-hash' where id = ?`, id)
  return id
}
/** A fresh client invitation nobody accepted, with a live link, for each call. */
let invitationCounter = 0
function freshInvitation(c: MatrixContext): string {
  const id = crypto.randomUUID()
  const now = new Date()
  const n = ++invitationCounter
  c.run(`insert into users (id, organisation_id, email, name, role, client_id, password_hash, units, active, created_at, updated_at) values (?, ?, ?, ?, 'client', ?, null, 'metric', 1, ?, ?)`,
    id, c.f.demo.organisationId, `matrix-invitee-${n}@tidewright.test`, `Matrix invitee ${n}`, c.f.demo.clients.lowe, now.toISOString(), now.toISOString())
  c.run(`insert into auth_tokens (id, user_id, purpose, token_hash, expires_at, created_at, updated_at) values (?, ?, 'invite', ?, ?, ?, ?)`,
    crypto.randomUUID(), id, `matrix-invite-${id}`, new Date(now.getTime() + 86_400_000).toISOString(), now.toISOString(), now.toISOString())
  return id
}
const settingsVersion = (c: MatrixContext) => c.query<{ v: number }>('select settings_version as v from organisations where id = ?', c.f.demo.organisationId)[0]!.v
const settingsBody = (c: MatrixContext) => ({ name: 'Saltline Reef Services', settings: structuredClone(DEFAULT_ORGANISATION_SETTINGS), version: settingsVersion(c) })
/** Company administration: the admin alone; other companies' staff are refused by role before anything is looked up. */
const adminOnly = (ok = 200): Expectations => ({ ...staffList(403), admin: ok })
/** The audit trail: admins, and supervisors for their own tanks. */
const auditReader = (ok = 200): Expectations => ({ ...staffList(403), admin: ok, supervisor: ok })

export const ACCESS_MATRIX: Record<string, MatrixEntry> = {
  'ANY /api/[...path]': {
    url: () => '/api/no-such-route/42',
    methods: ['GET', 'POST', 'PATCH', 'DELETE'],
    expect: everyone(404),
  },

  // Sign-in and the session
  'POST /api/auth/login': {
    url: () => '/api/auth/login',
    // Each persona signs in as itself (the test fills in the e-mail); signed out uses client@.
    body: () => ({ password: 'tidewright-demo' }),
    expect: everyone(200),
    freshSession: true,
    fuzz: { as: 'client', schema: LoginSchema, validBody: () => ({ email: 'client@tidewright.test', password: 'tidewright-demo' }), onlyRejected: true },
  },
  'POST /api/auth/logout': {
    url: () => '/api/auth/logout',
    expect: everyone(200),
    freshSession: true,
    fuzz: 'no-body',
  },
  'GET /api/me': { url: () => '/api/me', expect: anySignedIn() },

  // Clients and sites
  'GET /api/clients': { url: () => '/api/clients', expect: staffList() },
  'POST /api/clients': {
    url: () => '/api/clients',
    body: () => ({ name: 'Matrix Client' }),
    expect: { ...staffList(201), supervisor: 403 },
    fuzz: { as: 'aquarist', schema: ClientCreateSchema, validBody: () => ({ name: 'Fuzz Client', email: 'fuzz.client@example.test', phone: '555-0100', notes: 'Fuzzed' }) },
  },
  'GET /api/clients/[id]': { url: c => `/api/clients/${c.f.demo.clients.lowe}`, expect: staffOnTank() },
  'PATCH /api/clients/[id]': {
    url: c => `/api/clients/${c.f.demo.clients.lowe}`,
    body: () => ({ notes: 'Checked by the access matrix' }),
    expect: recordManager(),
    fuzz: { as: 'aquarist', schema: ClientPatchSchema, validBody: () => ({ notes: 'Fuzzed notes', phone: '555-0101' }) },
  },
  'POST /api/clients/[id]/archive': {
    url: async c => `/api/clients/${await freshClient(c)}/archive`,
    body: () => ({ archived: true }),
    expect: recordManager(),
    fuzz: { as: 'aquarist', schema: ARCHIVE_BODY, validBody: () => ({ archived: false }) },
  },
  'GET /api/clients/[id]/sites': { url: c => `/api/clients/${c.f.demo.clients.lowe}/sites`, expect: staffOnTank() },
  'POST /api/clients/[id]/sites': {
    url: c => `/api/clients/${c.f.demo.clients.lowe}/sites`,
    body: () => ({ label: 'Matrix site' }),
    expect: recordManager(201),
    fuzz: { as: 'aquarist', schema: SiteCreateSchema, validBody: () => ({ label: 'Fuzz site', address: '1 Example Row', roomNotes: 'Ground floor', accessNotes: 'Ring twice' }) },
  },
  'PATCH /api/sites/[id]': {
    url: c => `/api/sites/${loweSite(c)}`,
    body: () => ({ accessNotes: 'Checked by the access matrix' }),
    expect: recordManager(),
    fuzz: { as: 'aquarist', schema: SitePatchSchema, validBody: () => ({ accessNotes: 'Fuzzed', roomNotes: 'Fuzzed room' }) },
  },
  'POST /api/sites/[id]/archive': {
    url: async c => `/api/sites/${await freshSite(c)}/archive`,
    body: () => ({ archived: true }),
    expect: recordManager(),
    fuzz: { as: 'aquarist', schema: ARCHIVE_BODY, validBody: () => ({ archived: false }) },
  },
  'GET /api/staff': { url: () => '/api/staff', expect: staffList() },

  // People (admins only) and a person's own sessions
  'POST /api/people/[id]/deactivate': {
    url: c => `/api/people/${freshPerson(c)}/deactivate`,
    expect: { ...staffList(403), admin: 200 },
    fuzz: 'no-body',
  },
  'POST /api/people/[id]/reactivate': {
    url: c => `/api/people/${freshPerson(c)}/reactivate`,
    expect: { ...staffList(403), admin: 200 },
    fuzz: 'no-body',
  },
  'PATCH /api/people/[id]/role': {
    url: c => `/api/people/${freshPerson(c)}/role`,
    body: () => ({ role: 'supervisor' }),
    expect: { ...staffList(403), admin: 200 },
    fuzz: { as: 'admin', schema: PersonRoleSchema, validBody: () => ({ role: 'supervisor' }) },
  },
  'GET /api/me/sessions': { url: () => '/api/me/sessions', expect: anySignedIn() },
  'PUT /api/me/units': {
    url: () => '/api/me/units',
    body: () => ({ units: 'us' }),
    expect: anySignedIn(),
    fuzz: { as: 'client', schema: UnitsPreferenceSchema, validBody: () => ({ units: 'us' }) },
  },
  'POST /api/me/sessions/[id]/end': {
    url: c => `/api/me/sessions/${someoneElsesSession(c)}/end`,
    expect: anySignedIn(404),
    fuzz: 'no-body',
  },
  'POST /api/me/sessions/end-others': { url: () => '/api/me/sessions/end-others', expect: anySignedIn(), fuzz: 'no-body' },

  // Plan template and stages
  'GET /api/plan-template': { url: () => '/api/plan-template', expect: staffList() },
  'PUT /api/plan-template': {
    url: () => '/api/plan-template',
    body: () => ({ stages: DEFAULT_PLAN_TEMPLATE }),
    expect: { signedOut: 401, admin: 200, aquarist: 403, supervisor: 403, client: 403, otherClient: 403, otherCompany: 403 },
    fuzz: { as: 'admin', schema: PlanTemplateSchema, validBody: () => ({ stages: DEFAULT_PLAN_TEMPLATE.slice(0, 3) }) },
  },
  'GET /api/tanks/[id]/stages': { url: c => `/api/tanks/${c.f.demo.tanks.lounge}/stages`, expect: tankReader() },
  'PATCH /api/tanks/[id]/stages/[stageId]': {
    url: c => `/api/tanks/${c.f.demo.tanks.lounge}/stages/${firstStage(c)}`,
    body: () => ({ notes: 'Checked by the access matrix' }),
    expect: recordManager(),
    fuzz: { as: 'aquarist', schema: StagePatchSchema, validBody: () => ({ notes: 'Fuzzed', checklist: [{ id: 'x', done: true }] }) },
  },
  'POST /api/tanks/[id]/stages/[stageId]/uploads': {
    url: c => `/api/tanks/${c.f.demo.tanks.lounge}/stages/${firstStage(c)}/uploads`,
    body: () => fileForm(TINY_PDF, 'matrix.pdf', 'application/pdf'),
    expect: recordManager(201),
    fuzz: { upload: true, as: 'aquarist' },
  },
  'GET /api/uploads/[id]': { url: async c => `/api/uploads/${await loungeUpload(c, 'pdf')}`, expect: tankReader() },
  'GET /api/uploads/[id]/thumbnail': { url: async c => `/api/uploads/${await loungeUpload(c, 'png')}/thumbnail`, expect: tankReader() },
  // Only whoever added a file removes it: each persona gets a fresh one added by the aquarist.
  'DELETE /api/uploads/[id]': {
    url: async c => `/api/uploads/${await freshStageUpload(c)}`,
    expect: { signedOut: 401, admin: 403, aquarist: 204, supervisor: 403, client: 403, otherClient: 404, otherCompany: 404 },
  },

  // Tanks
  'GET /api/tanks': { url: () => '/api/tanks', expect: anySignedIn() },
  'POST /api/tanks': {
    url: () => '/api/tanks',
    body: c => ({ name: 'Matrix reef', clientId: c.f.demo.clients.lowe, shape: 'rectangular', dimensions: { lengthMm: 900, widthMm: 450, heightMm: 450 } }),
    // Another company's aquarist names our client: a field error, not a hint that it exists.
    expect: { signedOut: 401, admin: 201, aquarist: 201, supervisor: 403, client: 403, otherClient: 403, otherCompany: 400 },
    fuzz: { as: 'aquarist', schema: TankCreateSchema, validBody: c => ({ name: 'Fuzz reef', clientId: c.f.demo.clients.lowe, shape: 'rectangular', dimensions: { lengthMm: 900, widthMm: 450, heightMm: 450 }, sumpLitres: 40, material: 'glass', waterSource: 'mixed', cycleMethod: 'fishless' }) },
  },
  'GET /api/tanks/[id]': { url: c => `/api/tanks/${c.f.demo.tanks.lounge}`, expect: tankReader() },
  'PATCH /api/tanks/[id]': {
    url: c => `/api/tanks/${c.f.demo.tanks.lounge}`,
    body: () => ({ name: 'Marlowe lounge reef' }),
    expect: recordManager(),
    fuzz: { as: 'aquarist', schema: TankPatchSchema, validBody: () => ({ name: 'Marlowe lounge reef', sumpLitres: 60, material: 'glass' }) },
  },

  // Readings, events, verdict, chart, CSV
  'GET /api/tanks/[id]/readings': { url: c => `/api/tanks/${c.f.demo.tanks.lounge}/readings`, expect: tankReader() },
  'POST /api/tanks/[id]/test-photos': {
    url: c => `/api/tanks/${c.f.demo.tanks.lounge}/test-photos`,
    body: () => fileForm(TINY_PNG, 'test-strip.png', 'image/png'),
    expect: tankEntry(),
    fuzz: { upload: true, as: 'client' },
  },
  'POST /api/tanks/[id]/readings': {
    url: c => `/api/tanks/${c.f.demo.tanks.lounge}/readings`,
    body: () => READING_BODY(),
    expect: tankEntry(),
    fuzz: { as: 'client', schema: ReadingInputSchema, validBody: () => READING_BODY() },
  },
  'PATCH /api/tanks/[id]/readings/[readingId]': {
    url: async c => `/api/tanks/${c.f.demo.tanks.lounge}/readings/${await freshReading(c)}`,
    body: () => ({ notes: 'Corrected by the access matrix' }),
    expect: tankEntry(200),
    fuzz: { as: 'aquarist', schema: ReadingPatchSchema, validBody: () => ({ notes: 'Fuzzed', pH: 8.2, temperature: 25, temperatureUnit: 'C' }) },
  },
  'DELETE /api/tanks/[id]/readings/[readingId]': {
    url: async c => `/api/tanks/${c.f.demo.tanks.lounge}/readings/${await freshReading(c)}`,
    expect: tankEntry(204),
  },
  'GET /api/tanks/[id]/readings/export.csv': { url: c => `/api/tanks/${c.f.demo.tanks.lounge}/readings/export.csv`, expect: tankReader() },
  'POST /api/tanks/[id]/readings/import': {
    url: c => `/api/tanks/${c.f.demo.tanks.lounge}/readings/import`,
    body: () => ({ csv: `takenAt,ammonia\n${hoursAgo(3)},0.1\n`, dryRun: true }),
    expect: tankEntry(200),
    fuzz: { as: 'aquarist', schema: ReadingImportSchema, validBody: () => ({ csv: `takenAt,ammonia,pH\n${hoursAgo(3)},0.1,8.1\n`, dryRun: true, temperatureUnit: 'C', salinityMode: 'practical' }) },
  },
  'GET /api/tanks/[id]/events': { url: c => `/api/tanks/${c.f.demo.tanks.lounge}/events`, expect: tankReader() },
  'POST /api/tanks/[id]/events': {
    url: c => `/api/tanks/${c.f.demo.tanks.lounge}/events`,
    body: () => EVENT_BODY(),
    expect: tankEntry(),
    fuzz: { as: 'client', schema: EventInputSchema, validBody: () => ({ at: hoursAgo(2), kind: 'water-change', amount: 20, volumeUnit: 'L', notes: 'Fuzzed' }) },
  },
  'PATCH /api/tanks/[id]/events/[eventId]': {
    url: async c => `/api/tanks/${c.f.demo.tanks.lounge}/events/${await freshEvent(c)}`,
    body: () => ({ notes: 'Corrected by the access matrix' }),
    expect: tankEntry(200),
    fuzz: { as: 'aquarist', schema: EventPatchSchema, validBody: () => ({ notes: 'Fuzzed', kind: 'note' }) },
  },
  'DELETE /api/tanks/[id]/events/[eventId]': {
    url: async c => `/api/tanks/${c.f.demo.tanks.lounge}/events/${await freshEvent(c)}`,
    expect: tankEntry(204),
  },
  'GET /api/tanks/[id]/salinity-instrument': { url: c => `/api/tanks/${c.f.demo.tanks.lounge}/salinity-instrument`, expect: tankEntry(200) },
  'PUT /api/tanks/[id]/salinity-instrument': {
    url: c => `/api/tanks/${c.f.demo.tanks.lounge}/salinity-instrument`,
    body: () => ({ mode: 'sg', sgBasis: '25/25C' }),
    expect: tankEntry(200),
    fuzz: { as: 'client', schema: SalinityInstrumentSchema, validBody: () => ({ mode: 'sg', sgBasis: '77/60F' }) },
  },
  'GET /api/tanks/[id]/verdict': { url: c => `/api/tanks/${c.f.demo.tanks.lounge}/verdict`, expect: tankReader() },
  'GET /api/tanks/[id]/forecast': { url: c => `/api/tanks/${c.f.demo.tanks.lounge}/forecast`, expect: tankReader() },
  'GET /api/tanks/[id]/chart': { url: c => `/api/tanks/${c.f.demo.tanks.lounge}/chart`, expect: tankReader() },

  // Accounts, invitations and resets
  'POST /api/auth/forgot-password': {
    url: () => '/api/auth/forgot-password',
    body: () => ({ email: 'nobody-here@example.test' }),
    expect: everyone(200),
    fuzz: { as: 'client', schema: ForgotPasswordSchema, validBody: () => ({ email: 'nobody-here@example.test' }) },
  },
  'GET /api/auth/token': { url: () => `/api/auth/token?token=${UNUSED_TOKEN}`, expect: everyone(404) },
  'POST /api/auth/accept-invite': {
    url: () => '/api/auth/accept-invite',
    body: () => ({ token: UNUSED_TOKEN, password: 'a-long-enough-password' }),
    expect: everyone(410),
    freshSession: true,
    fuzz: { as: 'client', schema: SetPasswordSchema, validBody: () => ({ token: UNUSED_TOKEN, password: 'a-long-enough-password' }) },
  },
  'POST /api/auth/reset-password': {
    url: () => '/api/auth/reset-password',
    body: () => ({ token: UNUSED_TOKEN, password: 'a-long-enough-password' }),
    expect: everyone(410),
    freshSession: true,
    fuzz: { as: 'client', schema: SetPasswordSchema, validBody: () => ({ token: UNUSED_TOKEN, password: 'a-long-enough-password' }) },
  },
  'POST /api/invitations': {
    url: () => '/api/invitations',
    body: c => ({ email: `invitee-${++inviteCounter}@example.test`, name: 'Matrix Invitee', role: 'client', clientId: c.f.demo.clients.lowe }),
    // Another company's aquarist names our client: not found.
    expect: { ...recordManager(201) },
    fuzz: { as: 'aquarist', schema: InvitationSchema, validBody: c => ({ email: 'fuzz-invitee@example.test', name: 'Fuzz Invitee', role: 'client', clientId: c.f.demo.clients.lowe }) },
  },
  'GET /api/me/notification-preferences': { url: () => '/api/me/notification-preferences', expect: anySignedIn() },
  'PUT /api/me/notification-preferences': {
    url: () => '/api/me/notification-preferences',
    body: () => ({ emailKinds: {} }),
    expect: anySignedIn(),
    fuzz: { as: 'client', schema: NotificationPreferencesSchema, validBody: () => ({ emailKinds: {} }) },
  },

  // Alerts and notices
  'GET /api/alerts': { url: () => '/api/alerts', expect: staffList() },
  // Attention board: every signed-in person sees it for the tanks they may see.
  'GET /api/attention': { url: () => '/api/attention', expect: anySignedIn() },
  'POST /api/alerts/[id]/acknowledge': {
    url: c => `/api/alerts/${freshAlert(c)}/acknowledge`,
    body: () => ({ note: 'Seen by the access matrix' }),
    expect: staffOnTank(),
    fuzz: { as: 'aquarist', schema: AlertAcknowledgeSchema, validBody: () => ({ note: 'Fuzzed' }) },
  },
  'POST /api/alerts/[id]/resolve': {
    url: c => `/api/alerts/${freshAlert(c)}/resolve`,
    body: () => ({ note: 'Resolved by the access matrix' }),
    expect: staffOnTank(),
    fuzz: { as: 'aquarist', schema: AlertResolveSchema, validBody: () => ({ note: 'Fuzzed resolution' }) },
  },
  'GET /api/notifications': { url: () => '/api/notifications', expect: anySignedIn() },
  'GET /api/notifications/stream': { url: () => '/api/notifications/stream', expect: anySignedIn(), stream: true },
  'POST /api/notifications/[id]/read': {
    url: c => `/api/notifications/${freshNotice(c)}/read`,
    // Only the notice's owner (aquarist@) may mark it; to everyone else it does not exist.
    expect: { signedOut: 401, admin: 404, aquarist: 200, supervisor: 404, client: 404, otherClient: 404, otherCompany: 404 },
    fuzz: 'no-body',
  },
  'POST /api/notifications/read-all': { url: () => '/api/notifications/read-all', expect: anySignedIn(), fuzz: 'no-body' },
  // Local mail catcher and test clock: off unless NUXT_DEV_MAIL=1 / NUXT_TEST_HOOKS=1.
  'GET /api/dev/mail': { url: () => '/api/dev/mail', expect: everyone(404) },
  'GET /api/dev/outbox': { url: () => '/api/dev/outbox', expect: everyone(404) },
  'POST /api/dev/worker-tick': { url: () => '/api/dev/worker-tick', body: () => ({ now: new Date().toISOString() }), expect: everyone(404), fuzz: 'no-body' },

  // Sign-off. The lounge tank is mid-cycle: those allowed reach the domain check and get 409.
  'GET /api/reviews': {
    url: () => '/api/reviews',
    expect: { signedOut: 401, admin: 200, aquarist: 403, supervisor: 200, client: 403, otherClient: 403, otherCompany: 403 },
  },
  'GET /api/tanks/[id]/evidence': { url: c => `/api/tanks/${c.f.demo.tanks.lounge}/evidence`, expect: staffOnTank() },
  'GET /api/tanks/[id]/sign-off': { url: c => `/api/tanks/${c.f.demo.tanks.lounge}/sign-off`, expect: tankReader() },
  'POST /api/tanks/[id]/sign-off-requests': {
    url: c => `/api/tanks/${c.f.demo.tanks.lounge}/sign-off-requests`,
    body: () => ({ note: 'Matrix request' }),
    expect: recordManager(409),
    fuzz: { as: 'aquarist', schema: SignOffRequestSchema, validBody: () => ({ note: 'Fuzzed request' }) },
  },
  'POST /api/tanks/[id]/sign-off/decision': {
    url: c => `/api/tanks/${c.f.demo.tanks.lounge}/sign-off/decision`,
    body: () => ({ decision: 'return', note: 'Returned by the access matrix' }),
    expect: { signedOut: 401, admin: 409, aquarist: 403, supervisor: 409, client: 403, otherClient: 403, otherCompany: 403 },
    fuzz: { as: 'supervisor', schema: SignOffDecisionSchema, validBody: () => ({ decision: 'return', note: 'Fuzzed return' }) },
  },
  'POST /api/tanks/[id]/sign-off/reopen': {
    url: c => `/api/tanks/${c.f.demo.tanks.lounge}/sign-off/reopen`,
    body: () => ({ reason: 'Reopened by the access matrix' }),
    expect: { signedOut: 401, admin: 409, aquarist: 403, supervisor: 409, client: 403, otherClient: 403, otherCompany: 403 },
    fuzz: { as: 'supervisor', schema: SignOffReopenSchema, validBody: () => ({ reason: 'Fuzzed reopening' }) },
  },
  'POST /api/tanks/[id]/start-stocking': {
    url: c => `/api/tanks/${c.f.demo.tanks.lounge}/start-stocking`,
    body: () => ({}),
    expect: recordManager(409),
    fuzz: { as: 'aquarist', schema: StartStockingSchema, validBody: () => ({ livestock: { group: 'fish', count: 2, notes: 'Fuzzed' } }) },
  },
  'POST /api/tanks/[id]/readings/[readingId]/corrections': {
    url: async c => `/api/tanks/${c.f.demo.tanks.lounge}/readings/${await freshReading(c)}/corrections`,
    body: () => ({ reason: 'Corrected by the access matrix', pH: 8.2 }),
    expect: staffOnTank(201),
    fuzz: { as: 'aquarist', schema: ReadingCorrectionSchema, validBody: () => ({ reason: 'Fuzzed correction', pH: 8.2, notes: 'Fuzzed' }) },
  },
  'POST /api/tanks/[id]/events/[eventId]/corrections': {
    url: async c => `/api/tanks/${c.f.demo.tanks.lounge}/events/${await freshEvent(c)}/corrections`,
    body: () => ({ reason: 'Corrected by the access matrix', notes: 'Corrected' }),
    expect: staffOnTank(201),
    fuzz: { as: 'aquarist', schema: EventCorrectionSchema, validBody: () => ({ reason: 'Fuzzed correction', notes: 'Fuzzed' }) },
  },
  // The nano tank (client2's) is signed off first: its client and staff may download the certificate.
  'GET /api/tanks/[id]/certificate.pdf': {
    url: async c => (await signedOffNano(c), `/api/tanks/${c.f.demo.tanks.nano}/certificate.pdf`),
    expect: { signedOut: 401, admin: 200, aquarist: 200, supervisor: 200, client: 404, otherClient: 200, otherCompany: 404 },
  },
  // Public by design: whoever holds a certificate's code may check it.
  'GET /api/verify/[code]': {
    url: async c => `/api/verify/${await signedOffNano(c)}`,
    expect: everyone(200),
    discloses: c => [...c.query<{ name: string }>('select name from tanks where id = ?', c.f.demo.tanks.nano).map(r => r.name), 'Brinefield Aquarium Studio', 'Hollis Achterberg'],
  },

  // Benchmark floor routes: off unless NUXT_BENCH_ROUTES=1, so 404 for everyone here.
  'GET /api/bench/tanks': { url: c => `/api/bench/tanks?org=${c.f.demo.organisationId}`, expect: everyone(404) },
  'GET /api/bench/tanks/[id]': { url: c => `/api/bench/tanks/${c.f.demo.tanks.lounge}`, expect: everyone(404) },
  'GET /api/bench/tanks/[id]/readings': { url: c => `/api/bench/tanks/${c.f.demo.tanks.lounge}/readings`, expect: everyone(404) },
  'POST /api/bench/tanks/[id]/readings': {
    url: c => `/api/bench/tanks/${c.f.demo.tanks.lounge}/readings`,
    body: () => ({ takenAt: hoursAgo(1), ammoniaN: 0.1 }),
    expect: everyone(404),
    fuzz: 'no-body',
  },
  'GET /api/bench/tanks/[id]/verdict': { url: c => `/api/bench/tanks/${c.f.demo.tanks.lounge}/verdict`, expect: everyone(404) },

  // Company administration: people, invitations, settings, audit trail
  'GET /api/people': { url: () => '/api/people', expect: { signedOut: 401, admin: 200, aquarist: 200, supervisor: 403, client: 403, otherClient: 403, otherCompany: 200 } },
  'POST /api/people/[id]/password-reset': { url: c => `/api/people/${acceptedPerson(c)}/password-reset`, expect: adminOnly(), fuzz: 'no-body' },
  'POST /api/invitations/[id]/resend': { url: c => `/api/invitations/${freshInvitation(c)}/resend`, expect: recordManager(), fuzz: 'no-body' },
  'DELETE /api/invitations/[id]': { url: c => `/api/invitations/${freshInvitation(c)}`, expect: recordManager() },
  'GET /api/admin/attention': { url: () => '/api/admin/attention', expect: adminOnly() },
  'GET /api/settings': { url: () => '/api/settings', expect: adminOnly() },
  'GET /api/settings/reevaluation': { url: () => '/api/settings/reevaluation', expect: adminOnly() },
  'PUT /api/settings': {
    url: () => '/api/settings',
    body: settingsBody,
    expect: adminOnly(),
    fuzz: { as: 'admin', schema: CompanySettingsUpdateSchema, validBody: settingsBody },
  },
  'GET /api/audit': { url: c => `/api/audit?tankId=${c.f.demo.tanks.lounge}`, expect: auditReader() },
  'GET /api/audit/export.csv': { url: () => '/api/audit/export.csv', expect: auditReader() },
  'GET /api/audit/people': { url: () => '/api/audit/people', expect: auditReader() },
}

/** Routes a module registers rather than a file under server/api; checked the same way. */
export const MODULE_ROUTES: Record<string, MatrixEntry> = {
  // nuxt-auth-utils: the session as the client-side composable reads it.
  'GET /api/_auth/session': {
    url: () => '/api/_auth/session',
    expect: everyone(200),
  },
  'DELETE /api/_auth/session': {
    url: () => '/api/_auth/session',
    expect: everyone(200),
    freshSession: true,
  },
}
