/** Nitro glue for the attention board (server/domain/attention/board.ts): the actor's tank scope from access.ts. */
import type { AttentionQuery } from '#shared/schemas/attention'
import type { AttentionBoard } from '#shared/types/attention'
import { attentionBoard as boardInDb } from '#server/domain/attention/board'
import { visibleTankCondition, type Actor } from './access'

/** Every tank the actor may see with what it needs today, filtered and sorted as asked. */
export function attentionBoard(actor: Actor, query: AttentionQuery, now = new Date()): AttentionBoard {
  return boardInDb(useDB(), actor.organisationId, visibleTankCondition(actor), query, now)
}
