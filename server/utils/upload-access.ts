import { eq } from 'drizzle-orm'
import { uploads } from '#server/db/schema'
import type { Actor } from './access'

/** The upload row if the actor may see its tank; 404 otherwise (the same answer for "not yours" and "no such file"). */
export function requireVisibleUpload(actor: Actor, uploadId: string) {
  const row = useDB().select().from(uploads).where(eq(uploads.id, uploadId)).get()
  if (!row || row.organisationId !== actor.organisationId || !findVisibleTank(actor, row.tankId)) {
    throw createError({ statusCode: 404, statusMessage: 'File not found' })
  }
  return row
}
