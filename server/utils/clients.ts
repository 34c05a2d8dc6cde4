/** Nitro glue over server/domain/clients/queries.ts: the actor's organisation scopes every read, and a row not found is a 404. */
import type { ClientListQuery } from '#shared/schemas/clients'
import type { ClientList, ClientView } from '#shared/types/clients'
import { clientView as viewInDb, findClient as findInDb, findSite, listClients as listInDb } from '#server/domain/clients/queries'
import type { Actor } from './access'

export { toSiteView } from '#server/domain/clients/queries'

/** One page of the organisation's clients, searched by name, e-mail or phone. */
export function listClients(actor: Actor, query: ClientListQuery): ClientList {
  return listInDb(useDB(), actor.organisationId, query)
}

/** The client row of the actor's organisation, or undefined. Archived clients are still found (to restore or read). */
export function findClient(actor: Actor, clientId: string) {
  return findInDb(useDB(), actor.organisationId, clientId)
}

/** Like findClient but answers 404 itself. */
export function requireClient(actor: Actor, clientId: string) {
  const client = findClient(actor, clientId)
  if (!client) throw createError({ statusCode: 404, statusMessage: 'Client not found' })
  return client
}

/** The full view of a client with its sites. */
export function clientView(actor: Actor, clientId: string): ClientView | undefined {
  return viewInDb(useDB(), actor.organisationId, clientId)
}

/** The site row of the actor's organisation, or 404. */
export function requireSite(actor: Actor, siteId: string) {
  const site = findSite(useDB(), actor.organisationId, siteId)
  if (!site) throw createError({ statusCode: 404, statusMessage: 'Site not found' })
  return site
}
