import { beforeAll, describe, expect, it } from 'vitest'
import { Client, uniqueEmail } from '../support/http'
import { linkToken, waitForMail } from '../support/mail'
import { DEMO_PASSWORD } from '../../server/demo/data'

const as = async (email: string) => {
  const c = new Client()
  expect((await c.signIn(email, DEMO_PASSWORD)).status).toBe(200)
  return c
}

describe('role guards', () => {
  let people: Record<'anonymous' | 'guest' | 'host' | 'marketing' | 'manager', Client>
  beforeAll(async () => {
    people = {
      anonymous: new Client(),
      guest: await as('guest@saltmarsh.test'),
      host: await as('host@saltmarsh.test'),
      marketing: await as('marketing@saltmarsh.test'),
      manager: await as('manager@saltmarsh.test'),
    }
  })

  const staffRoutes: [string, string, unknown?][] = [
    ['GET', '/api/staff'],
    ['GET', '/api/reports/overview'],
    ['POST', '/api/staff', { name: 'N', email: 'n@example.test', role: 'host' }],
    ['PATCH', '/api/staff/2', { role: 'host' }],
    ['PATCH', '/api/venue', {}],
    ['POST', '/api/products', {}],
    ['PATCH', '/api/products/1', { name: 'N' }],
    ['POST', '/api/products/1/measurements', {}],
    ['POST', '/api/lab-sheets/check', { sheet: 'products', csv: 'code\nX' }],
    ['POST', '/api/lab-sheets', { sheet: 'products', csv: 'code\nX', lines: [2] }],
    ['GET', '/api/reports/bookings'],
    ['GET', '/reports/bookings.csv'],
    ['POST', '/api/sessions/1/cancel'],
  ]

  it.each(staffRoutes)('%s %s: anonymous 401, guest/host/marketing 403', async (method, path, body) => {
    expect((await people.anonymous.request(method, path, body)).status).toBe(401)
    for (const role of ['guest', 'host', 'marketing'] as const) {
      const res = await people[role].request(method, path, body)
      expect(res.status, role).toBe(403)
      expect(res.body.message).toMatch(/role does not allow/)
    }
  })

  it('the manager reads the staff list and the overview', async () => {
    expect((await people.manager.get('/api/staff')).status).toBe(200)
    const overview = await people.manager.get('/api/reports/overview')
    expect(overview.body.activeProducts).toBeGreaterThanOrEqual(6) // the demo has 6; other tests add more
  })

  it('the venue settings are public to read', async () => {
    const res = await people.anonymous.get('/api/venue')
    expect(res.status).toBe(200)
    expect(res.body.timeZone).toBe('America/New_York')
  })
})

describe('managing staff', () => {
  async function invitedAndAccepted(role: 'host' | 'marketing') {
    const m = await as('manager@saltmarsh.test')
    const email = uniqueEmail(role)
    const { body } = await m.post('/api/staff', { name: `Temp ${role}`, email, role })
    const token = linkToken(await waitForMail(email, /invited/), '/welcome')
    const person = new Client()
    await person.post('/api/auth/invitation', { token, password: 'staff-password-1' })
    return { m, id: body.id as number, email, person }
  }

  it('a role change ends the person\'s sessions; signed in again, the new role holds', async () => {
    const { m, id, email, person } = await invitedAndAccepted('host')
    expect((await person.get('/api/staff')).status).toBe(403)
    const changed = await m.patch(`/api/staff/${id}`, { role: 'manager' })
    expect(changed.status).toBe(200)
    expect(changed.body.role).toBe('manager')
    // The cookie sealed for the host no longer counts (issue 16, item 2: a role change bumps the session version).
    expect((await person.get('/api/staff')).status).toBe(401)
    const again = new Client()
    expect((await again.post('/api/auth/signin', { email, password: 'staff-password-1' })).status).toBe(200)
    expect((await again.get('/api/staff')).status).toBe(200)
  })

  it('disabling an account ends its session and blocks sign-in', async () => {
    const { m, id, email, person } = await invitedAndAccepted('marketing')
    expect((await person.get('/api/account')).status).toBe(200)
    expect((await m.patch(`/api/staff/${id}`, { disabled: true })).body.disabled).toBe(true)
    expect((await person.get('/api/account')).status).toBe(401)
    const again = await new Client().signIn(email, 'staff-password-1')
    expect(again.status).toBe(403)
    expect(again.body.message).toMatch(/disabled/)
    await m.patch(`/api/staff/${id}`, { disabled: false })
    expect((await new Client().signIn(email, 'staff-password-1')).status).toBe(200)
  })

  it('a manager cannot change their own account, nor turn staff into guests', async () => {
    const m = await as('manager@saltmarsh.test')
    const me = (await m.get('/api/account')).body
    const self = await m.patch(`/api/staff/${me.id}`, { disabled: true })
    expect(self.status).toBe(409)
    const list = (await m.get('/api/staff')).body as { id: number, email: string }[]
    const host = list.find(s => s.email === 'host@saltmarsh.test')!
    const toGuest = await m.patch(`/api/staff/${host.id}`, { role: 'guest' })
    expect(toGuest.status).toBe(400)
    const empty = await m.patch(`/api/staff/${host.id}`, {})
    expect(empty.status).toBe(400)
    const notANumber = await m.patch('/api/staff/abc', { role: 'host' })
    expect(notANumber.status).toBe(400)
    expect(notANumber.body.data.fields.id).toMatch(/number/)
  })

  it('guests are not staff: their id answers 404 on the staff route', async () => {
    const m = await as('manager@saltmarsh.test')
    const guest = await as('guest@saltmarsh.test')
    const gid = (await guest.get('/api/account')).body.id
    expect((await m.patch(`/api/staff/${gid}`, { role: 'host' })).status).toBe(404)
  })
})

describe('venue settings', () => {
  it('the manager saves valid settings; the standard drink follows the chosen definition', async () => {
    const m = await as('manager@saltmarsh.test')
    const venue = (await m.get('/api/venue')).body
    const { id, ...settings } = venue
    const uk = await m.patch('/api/venue', { ...settings, standardDrinkKind: 'uk', standardDrinkGrams: 99 })
    expect(uk.status).toBe(200)
    expect(uk.body.standardDrinkGrams).toBe(8) // UK unit: 10 mL = 8 g of ethanol (NHS)
    const custom = await m.patch('/api/venue', { ...settings, standardDrinkKind: 'custom', standardDrinkGrams: 12.5 })
    expect(custom.body.standardDrinkGrams).toBe(12.5)
    expect((await m.patch('/api/venue', settings)).body.standardDrinkGrams).toBe(14) // NIAAA: 14 g
  })

  it('answers 400 with a message per field and changes nothing', async () => {
    const m = await as('manager@saltmarsh.test')
    const before = (await m.get('/api/venue')).body
    const { id, ...settings } = before
    const res = await m.patch('/api/venue', { ...settings, timeZone: 'Mars/Olympus', currency: 'DOLLARS', legalAge: -3, volumeUnit: 'pints' })
    expect(res.status).toBe(400)
    expect(Object.keys(res.body.data.fields).sort()).toEqual(['currency', 'legalAge', 'timeZone', 'volumeUnit'])
    expect((await m.get('/api/venue')).body).toEqual(before)
  })
})
