import { describe, expect, it } from 'vitest'
import { Client } from '../support/http'

describe('cross-site requests', () => {
  it('refuses a state-changing request from another site, allows the same site and reads', async () => {
    const c = new Client()
    const evil = await c.request('POST', '/api/auth/signin', { email: 'guest@saltmarsh.test', password: 'x' }, { origin: 'https://evil.example' })
    expect(evil.status).toBe(403)
    expect(evil.body.message).toMatch(/another site/)
    const fetchSite = await c.request('POST', '/api/auth/signin', { email: 'guest@saltmarsh.test', password: 'x' }, { 'sec-fetch-site': 'cross-site' })
    expect(fetchSite.status).toBe(403)
    const nullOrigin = await c.request('POST', '/api/auth/signout', {}, { origin: 'null' })
    expect(nullOrigin.status).toBe(403)
    const same = await c.request('POST', '/api/auth/signin', { email: 'guest@saltmarsh.test', password: 'wrong-password' }, { 'sec-fetch-site': 'same-origin' })
    expect(same.status).toBe(401)
    expect((await c.request('GET', '/api/venue', undefined, { origin: 'https://evil.example' })).status).toBe(200)
  })
})
