/** GET /api/me — the signed-in user as the database knows them now. Returns MeView. */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  return { id: actor.id, name: actor.name, role: actor.role, units: actor.units }
})
