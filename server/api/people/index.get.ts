import { PeopleQuerySchema } from '#shared/schemas/people'
import type { PeopleList } from '#shared/types/people'
import { listPeople } from '#server/domain/people/queries'

/** GET /api/people — one page of the company's staff and client accounts (an aquarist sees client accounts only), searched and filtered. Returns PeopleList. */
export default defineEventHandler(async (event): Promise<PeopleList> => {
  const actor = await requireActor(event, ['admin', 'aquarist'])
  const query = await getValidatedQuery(event, valid(PeopleQuerySchema))
  return listPeople(useDB(), actor, query, requestNow(event))
})
