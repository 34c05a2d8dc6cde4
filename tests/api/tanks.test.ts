import { describe, expect, inject, it } from 'vitest'
import { ApiClient, signedIn } from '../support/http'
import { OTHER_AQUARIST_EMAIL } from '../support/fixtures'
import type { TankList, TankView } from '../../shared/types/tanks'

const { demo, other } = inject('fixtures')

describe('GET /api/tanks', () => {
  it('is 401 when signed out, without handing out a session cookie', async () => {
    const response = await new ApiClient().get('/api/tanks')
    expect(response.status).toBe(401)
    expect(response.headers.getSetCookie()).toEqual([])
  })

  it('shows a client only their own tanks', async () => {
    const api = await signedIn('client@tidewright.test')
    const { status, body } = await api.get<TankList>('/api/tanks')
    expect(status).toBe(200)
    expect(body.items.map(t => t.id).sort()).toEqual([demo.tanks.lobby, demo.tanks.lounge].sort())
    expect(body.items.every(t => t.clientId === demo.clients.lowe)).toBe(true)
    expect(body.total).toBe(2)
  })

  it('shows staff every tank of their own company and none of another', async () => {
    const api = await signedIn('aquarist@tidewright.test')
    const { body } = await api.get<TankList>('/api/tanks')
    expect(body.items.map(t => t.id).sort()).toEqual(Object.values(demo.tanks).sort())
    expect(body.items.some(t => t.id === other.tankId)).toBe(false)
    const theirs = await (await signedIn(OTHER_AQUARIST_EMAIL)).get<TankList>('/api/tanks')
    expect(theirs.body.items.map(t => t.id)).toEqual([other.tankId])
  })

  it('filters by status, searches by name and pages on the server', async () => {
    const api = await signedIn('supervisor@tidewright.test')
    const cycling = await api.get<TankList>('/api/tanks?status=cycling')
    expect(cycling.body.items.map(t => t.id).sort()).toEqual([demo.tanks.lounge, demo.tanks.study].sort())
    const search = await api.get<TankList>('/api/tanks?q=quay')
    expect(search.body.items.map(t => t.id)).toEqual([demo.tanks.nano])
    const page1 = await api.get<TankList>('/api/tanks?sort=name&dir=asc&pageSize=3&page=1')
    const page2 = await api.get<TankList>('/api/tanks?sort=name&dir=asc&pageSize=3&page=2')
    expect(page1.body.total).toBe(4)
    expect(page1.body.items).toHaveLength(3)
    expect(page2.body.items).toHaveLength(1)
    const names = [...page1.body.items, ...page2.body.items].map(t => t.name)
    expect(names).toEqual([...names].sort((a, b) => a.localeCompare(b)))
  })

  it('treats LIKE wildcards in the search as plain text', async () => {
    const api = await signedIn('supervisor@tidewright.test')
    const { body } = await api.get<TankList>('/api/tanks?q=%25')
    expect(body.items).toEqual([])
  })

  it('refuses bad query values with 400 and a message', async () => {
    const api = await signedIn('aquarist@tidewright.test')
    for (const query of ['status=drained', 'page=0', 'pageSize=1000', 'sort=password', 'page=abc']) {
      const response = await api.get(`/api/tanks?${query}`)
      expect(response.status, query).toBe(400)
      expect(response.body.data.issues.length, query).toBeGreaterThan(0)
    }
  })
})

describe('GET /api/tanks/:id', () => {
  it('returns the tank with its people and canonical values', async () => {
    const api = await signedIn('client2@tidewright.test')
    const { status, body } = await api.get<TankView>(`/api/tanks/${demo.tanks.nano}`)
    expect(status).toBe(200)
    expect(body).toMatchObject({ id: demo.tanks.nano, name: 'Quay Street nano', status: 'cycled', volumeLitres: 91.1, supervisorName: 'Hollis Achterberg' })
  })

  it('is 404 for another client\'s tank and for another company\'s tank', async () => {
    const client2 = await signedIn('client2@tidewright.test')
    expect((await client2.get(`/api/tanks/${demo.tanks.lounge}`)).status).toBe(404)
    const client = await signedIn('client@tidewright.test')
    expect((await client.get(`/api/tanks/${demo.tanks.nano}`)).status).toBe(404)
    const aquarist = await signedIn('aquarist@tidewright.test')
    const response = await aquarist.get(`/api/tanks/${other.tankId}`)
    expect(response.status).toBe(404)
    expect(JSON.stringify(response.body)).not.toContain('Brookmoor')
  })

  it('is 400 for an id that is not an id, and 401 signed out', async () => {
    const api = await signedIn('aquarist@tidewright.test')
    expect((await api.get('/api/tanks/..%2F..%2Fetc')).status).toBe(400)
    expect((await new ApiClient().get(`/api/tanks/${demo.tanks.nano}`)).status).toBe(401)
  })
})
