import { createPinia, setActivePinia } from 'pinia'
import { beforeEach, describe, expect, it } from 'vitest'
import { unreadFromStreamEvent, useNoticesStore } from '../../../../app/stores/notices'

describe('the unread notices store', () => {
  beforeEach(() => setActivePinia(createPinia()))

  it('takes the count from a stream event and counts the event, so listening pages reload', () => {
    const notices = useNoticesStore()
    notices.receiveStreamEvent('{"unread":3}')
    expect(notices.unread).toBe(3)
    expect(notices.changes).toBe(1)
  })

  it('ignores a malformed event or a count that is not one', () => {
    const notices = useNoticesStore()
    notices.setUnread(2)
    for (const data of ['not json', '{"unread":-1}', '{"unread":"7"}', 'null', '{"unread":1.5}']) notices.receiveStreamEvent(data)
    notices.setUnread(undefined)
    expect(notices.unread).toBe(2)
    expect(notices.changes).toBe(0)
  })

  it('is one count for every user of the store, and forgets it on sign-out', () => {
    useNoticesStore().setUnread(5)
    expect(useNoticesStore().unread).toBe(5)
    useNoticesStore().$reset()
    expect(useNoticesStore().unread).toBe(0)
  })

  it('reads the count an event carries', () => {
    expect(unreadFromStreamEvent('{"unread":0}')).toBe(0)
    expect(unreadFromStreamEvent('{}')).toBeNull()
  })
})
