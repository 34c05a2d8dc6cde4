/**
 * GET /api/notifications/stream — server-sent events for the signed-in user: an `unread`
 * event with { unread } at once and whenever their notices change; a `ping` event every 25 s
 * keeps proxies from closing the stream.
 */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const stream = createEventStream(event)
  const push = () => void stream.push({ event: 'unread', data: JSON.stringify({ unread: unreadCount(actor.id) }) }).catch(() => undefined)
  const unsubscribe = onNoticesChanged(actor.id, push)
  const keepAlive = setInterval(() => void stream.push({ event: 'ping', data: '1' }).catch(() => undefined), 25_000)
  stream.onClosed(async () => {
    unsubscribe()
    clearInterval(keepAlive)
    await stream.close()
  })
  push()
  return stream.send()
})
