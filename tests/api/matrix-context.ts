/**
 * What the access-matrix entries are called with, built once for every suite that walks the
 * matrix (access, fuzz, handler contract) against its own server.
 */
import Database from 'better-sqlite3'
import { queryFile } from '../support/db-checksum'
import { ApiClient } from '../support/http'
import type { OwnServer } from '../support/own-server'
import { PERSONA_EMAIL, type MatrixContext, type Persona } from './access-matrix.data'

/** A session per persona on this server, signed in once and reused; signed out is a fresh anonymous client. */
export function personaSessions(own: OwnServer): (persona: Persona) => Promise<ApiClient> {
  const sessions = new Map<Persona, ApiClient>()
  return async (persona) => {
    if (persona === 'signedOut') return new ApiClient(own.server.baseURL)
    if (!sessions.has(persona)) sessions.set(persona, await new ApiClient(own.server.baseURL).signIn(PERSONA_EMAIL[persona]))
    return sessions.get(persona)!
  }
}

/** The matrix context on this server's fixtures and database file. */
export function matrixContext(own: OwnServer, as: MatrixContext['as']): MatrixContext {
  return {
    f: own.fixtures,
    as,
    query: (sql, ...params) => queryFile(own.dbPath, sql, ...params),
    run: (sql, ...params) => {
      const db = new Database(own.dbPath)
      try {
        db.pragma('busy_timeout = 5000')
        db.prepare(sql).run(...params)
      }
      finally {
        db.close()
      }
    },
  }
}
