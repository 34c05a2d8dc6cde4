/** Checks a tank's references and dimensions, and computes what the server stores from them. */
import { and, eq, isNull } from 'drizzle-orm'
import type { TankDimensionsMm } from '#shared/calc/volume'
import { tankVolumeFromDimensions } from '#shared/tanks/dimensions'
import type { SHAPE_DIMENSIONS } from '#shared/schemas/tanks'
import { clients, sites, users } from '#server/db/schema'
import type { Actor } from './access'
import type { FieldIssue } from '#server/domain/validation/field-issues'

/** Keeps only the dimensions the shape uses and computes the gross volume in litres; 400 when one is missing or impossible. */
export function volumeFromDimensions(shape: keyof typeof SHAPE_DIMENSIONS, dimensions: TankDimensionsMm): { dimensions: TankDimensionsMm, volumeLitres: number } {
  const result = tankVolumeFromDimensions(shape, dimensions)
  if (!result.ok) fieldError(result.issues)
  return { dimensions: result.dimensions, volumeLitres: result.volumeLitres }
}

/** 400 unless the client, site and staff all belong to the actor's organisation and fit their roles. */
export function checkTankReferences(actor: Actor, refs: { clientId?: string, siteId?: string | null, aquaristId?: string | null, supervisorId?: string | null }, currentClientId?: string) {
  const db = useDB()
  const issues: FieldIssue[] = []
  const clientId = refs.clientId ?? currentClientId
  if (refs.clientId !== undefined) {
    const client = db.select().from(clients).where(and(eq(clients.id, refs.clientId), eq(clients.organisationId, actor.organisationId), isNull(clients.archivedAt))).get()
    if (!client) issues.push({ field: 'clientId', message: 'Choose one of your company\'s clients.' })
  }
  if (refs.siteId) {
    const site = db.select().from(sites).where(and(eq(sites.id, refs.siteId), eq(sites.organisationId, actor.organisationId))).get()
    if (!site || site.clientId !== clientId) issues.push({ field: 'siteId', message: 'Choose one of this client\'s sites.' })
  }
  const staff = (id: string) => db.select().from(users).where(and(eq(users.id, id), eq(users.organisationId, actor.organisationId), eq(users.active, true))).get()
  if (refs.aquaristId) {
    const user = staff(refs.aquaristId)
    if (!user || (user.role !== 'aquarist' && user.role !== 'admin')) issues.push({ field: 'aquaristId', message: 'Choose one of your company\'s aquarists.' })
  }
  if (refs.supervisorId) {
    const user = staff(refs.supervisorId)
    if (!user || (user.role !== 'supervisor' && user.role !== 'admin')) issues.push({ field: 'supervisorId', message: 'Choose one of your company\'s supervisors.' })
  }
  if (issues.length) fieldError(issues)
}
