/**
 * readOrganisationSettings against a real migrated SQLite file: the row is read on every call, so
 * a saved change is seen at once, while an unchanged row reuses one frozen parse.
 */
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { migrateDatabase, openDatabase, type TidewrightDB } from '../../../../server/db/connection'
import { organisations, users } from '../../../../server/db/schema'
import { readOrganisationSettings } from '../../../../server/db/settings'
import { readCompanySettings, saveCompanySettings } from '../../../../server/domain/settings/update'
import { DEFAULT_ORGANISATION_SETTINGS } from '../../../../shared/schemas/settings'

const dir = mkdtempSync(join(tmpdir(), 'tidewright-settings-read-'))
let db: TidewrightDB
beforeAll(() => {
  db = openDatabase(join(dir, 'settings.sqlite'))
  migrateDatabase(db)
})
afterAll(() => {
  db?.$client.close()
  rmSync(dir, { recursive: true, force: true })
})

describe('readOrganisationSettings', () => {
  it('sees a saved change on the next read, and reuses the parse while the row is unchanged', () => {
    const organisationId = db.insert(organisations).values({ name: 'Harbour Reefs' }).returning().get().id
    const admin = { id: db.insert(users).values({ organisationId, email: 'admin@harbour.test', name: 'Admin', role: 'admin' }).returning().get().id, organisationId }
    const first = readOrganisationSettings(db, organisationId)
    expect(first).toEqual(DEFAULT_ORGANISATION_SETTINGS)
    expect(readOrganisationSettings(db, organisationId)).toBe(first)
    expect(Object.isFrozen(first.thresholds)).toBe(true)

    const view = readCompanySettings(db, organisationId)!
    const saved = saveCompanySettings(db, admin, { name: view.name, settings: { ...view.settings, timeZone: 'Pacific/Auckland', thresholds: { ammoniaZeroN: 0.1 } }, version: view.version }, new Date())
    expect(saved).toMatchObject({ ok: true })
    const after = readOrganisationSettings(db, organisationId)
    expect(after.thresholds).toEqual({ ammoniaZeroN: 0.1 })
    expect(after.timeZone).toBe('Pacific/Auckland')
    expect(first.thresholds).toEqual({})
  })

  it('reads Tidewright\'s defaults for a company that does not exist', () => {
    expect(readOrganisationSettings(db, '00000000-0000-4000-8000-000000000000')).toEqual(DEFAULT_ORGANISATION_SETTINGS)
  })
})
