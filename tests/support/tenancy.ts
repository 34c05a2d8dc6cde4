/**
 * What each persona must never see, read from the database itself: the ids and names of
 * tanks, clients, users and companies outside their view. Responses are searched for
 * these strings, so a leak shows up whatever shape the response has.
 */
import { queryFile } from './db-checksum'

interface UserRow { id: string, name: string, email: string, role: string, organisation_id: string, client_id: string | null }

/** Strings (ids, names, e-mails) the user with this e-mail must never receive. */
export function forbiddenFor(dbPath: string, email: string): string[] {
  const [me] = queryFile<UserRow>(dbPath, 'select * from users where email = ?', email)
  if (!me) throw new Error(`no user ${email}`)
  const isClient = me.role === 'client'
  const out = new Set<string>()
  for (const org of queryFile<{ id: string, name: string }>(dbPath, 'select id, name from organisations where id != ?', me.organisation_id)) {
    out.add(org.id).add(org.name)
  }
  for (const tank of queryFile<{ id: string, name: string, organisation_id: string, client_id: string }>(dbPath, 'select id, name, organisation_id, client_id from tanks')) {
    if (tank.organisation_id !== me.organisation_id || (isClient && tank.client_id !== me.client_id)) out.add(tank.id).add(tank.name)
  }
  for (const client of queryFile<{ id: string, name: string, organisation_id: string }>(dbPath, 'select id, name, organisation_id from clients')) {
    if (client.organisation_id !== me.organisation_id || (isClient && client.id !== me.client_id)) out.add(client.id).add(client.name)
  }
  for (const user of queryFile<UserRow>(dbPath, 'select * from users')) {
    const otherClientUser = isClient && user.role === 'client' && user.client_id !== me.client_id
    if (user.organisation_id !== me.organisation_id || otherClientUser) out.add(user.id).add(user.email).add(user.name)
  }
  // Names shorter than this could match ordinary words; every fixture name is longer.
  return [...out].filter(s => s.length >= 6)
}

/** The forbidden strings found in a response text (the request's own URL removed first, since error bodies echo it). */
export function leaksIn(text: string, forbidden: readonly string[], requestPath: string): string[] {
  const cleaned = text.split(requestPath).join('')
  return forbidden.filter(s => cleaned.includes(s))
}
