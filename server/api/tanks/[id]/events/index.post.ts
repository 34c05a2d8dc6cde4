import { IdParams } from '#shared/schemas/common'
import { EventInputSchema } from '#shared/schemas/reading'
import { toCanonicalEvent } from '#shared/readings/events'
import type { EventView } from '#shared/types/readings'
import { events } from '#server/db/schema'
import { eventColumns } from '#server/domain/readings/columns'

/**
 * POST /api/tanks/:id/events — logs an ammonia dose (stored mg/L as N), bacteria dose,
 * water change (stored in litres), livestock added, lighting change or note, and
 * re-evaluates the tank. Returns EventView (201).
 */
export default defineEventHandler(async (event): Promise<EventView> => {
  const actor = await requireActor(event, ENTRY_ROLES)
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  const tank = requireVisibleTank(actor, id)
  const input = await readValidatedBody(event, valid(EventInputSchema))
  const result = toCanonicalEvent(input)
  if (!result.ok) fieldError(result.issues)
  const db = useDB()
  const row = await writeTransaction(() => {
    // Checked under the write lock: a sign-off decided while this save waited for it counts.
    assertWritableAt(tank.id, result.event.at)
    const inserted = db.insert(events).values({ tankId: tank.id, enteredBy: actor.id, ...eventColumns(result.event) }).returning().get()
    writeAudit(actor, { action: 'event.create', entity: 'event', entityId: inserted.id, after: inserted })
    return inserted
  })
  await onTankDataChanged(tank.id, { actor })
  setResponseStatus(event, 201)
  return toEventView(row, actor.name, actor, tank)
})
