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
import type { GenericSchema } from 'valibot'
import { LoginSchema } from '../../shared/schemas/auth'
import type { Fixtures } from '../support/fixtures'

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
export type FuzzPlan =
  | 'no-body' // the route reads no body: any body must still never cause a 5xx
  | {
    /** Who sends the hostile bodies (someone allowed to use the route). */
    as: Exclude<Persona, 'signedOut'>
    /** The valibot schema the handler validates the body with: a body it rejects must get a 4xx and change nothing. */
    schema: GenericSchema
    /** A body the route accepts, mutated field by field by the fuzzer. */
    validBody: (f: Fixtures) => Record<string, unknown>
    /** Keep accepted fuzz bodies from reaching the route (e.g. sign-in, where accepted bodies feed the throttle). */
    onlyRejected?: boolean
  }

export interface MatrixEntry {
  /** The concrete URL to call, normally a resource of the `client` persona's tank. */
  url: (f: Fixtures) => string
  /** Methods to call for an ANY route (a file without a method suffix). */
  methods?: string[]
  body?: (f: Fixtures) => unknown
  expect: Expectations
  /** The call ends or replaces the session: each persona signs in afresh for it. */
  freshSession?: boolean
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

export const ACCESS_MATRIX: Record<string, MatrixEntry> = {
  'ANY /api/[...path]': {
    url: () => '/api/no-such-route/42',
    methods: ['GET', 'POST', 'PATCH', 'DELETE'],
    expect: everyone(404),
  },
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
  'GET /api/me': {
    url: () => '/api/me',
    expect: anySignedIn(),
  },
  'GET /api/tanks': {
    url: () => '/api/tanks',
    expect: anySignedIn(),
  },
  'GET /api/tanks/[id]': {
    url: f => `/api/tanks/${f.demo.tanks.lounge}`,
    expect: tankReader(),
  },
  // Benchmark floor routes: off unless NUXT_BENCH_ROUTES=1, so 404 for everyone here.
  'GET /api/bench/tanks': {
    url: f => `/api/bench/tanks?org=${f.demo.organisationId}`,
    expect: everyone(404),
  },
  'GET /api/bench/tanks/[id]': {
    url: f => `/api/bench/tanks/${f.demo.tanks.lounge}`,
    expect: everyone(404),
  },
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
