import { describe, expect, it } from 'vitest'
import { Client, uniqueEmail } from '../support/http'
import { countRows } from '../support/db'
import { waitForMail } from '../support/mail'
import { confirmAddress, newGuest, waitFor } from '../support/booking'
import { DEMO_PASSWORD } from '../../server/demo/data'

const adult = { name: 'Ruth Okonkwo', password: 'a-long-enough-secret', dateOfBirth: '1990-06-01' }

describe('guest sign-up', () => {
  it('creates an unconfirmed guest account; the e-mailed link confirms it and signs the guest in', async () => {
    const c = new Client()
    const email = uniqueEmail('signup')
    const res = await c.post('/api/auth/signup', { ...adult, email: email.toUpperCase() })
    expect(res.status).toBe(202)
    expect(res.body.message).toMatch(/Check your e-mail/)
    expect((await c.get('/api/account')).status).toBe(401)
    await confirmAddress(c, email)
    const me = await c.get('/api/account')
    expect(me.status).toBe(200)
    expect(me.body).toMatchObject({ email, role: 'guest', dateOfBirth: '1990-06-01', emailConfirmed: true })
  })

  it('answers a taken address as a new one, changes nothing and tells the owner by e-mail', async () => {
    const { email } = await newGuest('dup')
    const before = await countRows('users')
    const res = await new Client().post('/api/auth/signup', { ...adult, email })
    expect(res.status).toBe(202)
    expect(res.body.message).toMatch(/Check your e-mail/)
    await waitForMail(email, /already have an account/)
    expect(await countRows('users')).toBe(before)
  })

  it.each([
    ['a short password', { password: 'short' }, 'password', /at least 10 characters/],
    ['a malformed date', { dateOfBirth: '1990-13-45' }, 'dateOfBirth', /does not exist|YYYY-MM-DD/],
    ['a date in the wrong format', { dateOfBirth: '01/06/1990' }, 'dateOfBirth', /YYYY-MM-DD/],
    ['a missing name', { name: '' }, 'name', /Enter a name/],
    ['a bad e-mail', { email: 'not-an-address' }, 'email', /valid e-mail/],
    ['a number for the name', { name: 42 }, 'name', /Enter a name/],
  ])('answers 400 for %s', async (_label, patch, field, message) => {
    const before = await countRows('users')
    const res = await new Client().post('/api/auth/signup', { ...adult, email: uniqueEmail('bad'), ...patch })
    expect(res.status).toBe(400)
    expect(res.body.data.fields[field]).toMatch(message)
    expect(await countRows('users')).toBe(before)
  })

  it('refuses someone under the venue\'s legal drinking age', async () => {
    const venue = (await new Client().get('/api/venue')).body
    const d = new Date()
    const dob = `${d.getUTCFullYear() - venue.legalAge + 1}-01-01`
    const res = await new Client().post('/api/auth/signup', { ...adult, email: uniqueEmail('young'), dateOfBirth: dob })
    expect(res.status).toBe(400)
    expect(res.body.data.fields.dateOfBirth).toMatch(new RegExp(`at least ${venue.legalAge}`))
  })

  it('answers 400 to a body that is not JSON', async () => {
    const res = await new Client().request('POST', '/api/auth/signup', '{"name": "x",', { 'content-type': 'application/json' })
    expect(res.status).toBe(400)
    expect(res.body.message).toMatch(/not valid JSON/)
  })
})

describe('sign-in and sign-out', () => {
  it('signs in with the right password, refuses the wrong one, and signs out', async () => {
    const c = new Client()
    const wrong = await c.signIn('host@saltmarsh.test', 'not-the-password')
    expect(wrong.status).toBe(401)
    expect(wrong.body.message).toMatch(/do not match/)
    const ok = await c.signIn('host@saltmarsh.test', DEMO_PASSWORD)
    expect(ok.status).toBe(200)
    expect(ok.body.user.role).toBe('host')
    expect((await c.get('/api/account')).status).toBe(200)
    expect((await c.post('/api/auth/signout')).status).toBe(200)
    expect((await c.get('/api/account')).status).toBe(401)
  })

  it('gives an unknown e-mail the same answer as a wrong password', async () => {
    const res = await new Client().signIn(uniqueEmail('nobody'), 'whatever-password')
    expect(res.status).toBe(401)
    expect(res.body.message).toMatch(/do not match/)
  })

  it('stores only a hash of the password', async () => {
    const email = uniqueEmail('hash')
    await new Client().post('/api/auth/signup', { ...adult, email })
    const hash = await waitFor(() => import('../support/db').then(m => m.withDb(async (c) => {
      const [rows] = await c.query('SELECT password_hash AS h FROM users WHERE email = ?', [email])
      return (rows as { h: string }[])[0]?.h
    })), 'the new account')
    expect(hash).not.toContain(adult.password)
    expect(hash).toMatch(/^\$scrypt\$/)
  })
})

describe('sign-in throttling', () => {
  it('makes an address wait after 5 failures at one account, with a retry time, and lets the owner in from elsewhere', async () => {
    const { email } = await newGuest('lock')
    const attacker = new Client()
    for (let i = 0; i < 5; i++) expect((await attacker.signIn(email, `wrong-${i}-password`)).status).toBe(401)
    const slowed = await attacker.signIn(email, 'wrong-again')
    expect(slowed.status).toBe(429)
    expect(slowed.body.message).toMatch(/at this account from your network\. Try again in 30 seconds/)
    expect(slowed.body.data.retryAfterSeconds).toBeGreaterThan(25)
    expect(Number(slowed.headers.get('retry-after'))).toBeGreaterThan(25)
    // The owner, from another address and with the right password, is not held back.
    expect((await new Client().signIn(email, 'guest-password-1')).status).toBe(200)
  })

  it('slows an address after 30 failures across accounts, and only that address', async () => {
    const { email } = await newGuest('iplock')
    const sprayer = new Client()
    for (let i = 0; i < 30; i++) expect((await sprayer.signIn(uniqueEmail(`spray${i}`), 'password-guess')).status).toBe(401)
    const blocked = await sprayer.signIn(email, 'guest-password-1')
    expect(blocked.status).toBe(429)
    expect(blocked.body.message).toMatch(/from your network/)
    expect((await new Client().signIn(email, 'guest-password-1')).status).toBe(200)
  })

  it('a successful sign-in clears the account\'s failures', async () => {
    const { email } = await newGuest('clear')
    const c = new Client()
    for (let i = 0; i < 4; i++) await c.signIn(email, 'nope-nope-nope')
    expect((await c.signIn(email, 'guest-password-1')).status).toBe(200)
    for (let i = 0; i < 4; i++) expect((await c.signIn(email, 'nope-nope-nope')).status).toBe(401)
    expect((await c.signIn(email, 'guest-password-1')).status).toBe(200)
  })
})

describe('sign-ups at the same moment', () => {
  it('different addresses all get their account; the same address gets exactly one', async () => {
    const emails = Array.from({ length: 20 }, (_, i) => uniqueEmail(`burst${i}`))
    const many = await Promise.all(emails.map(email => new Client().post('/api/auth/signup', { ...adult, email })))
    expect(many.map(r => r.status)).toEqual(Array(20).fill(202))
    const email = uniqueEmail('same')
    const same = await Promise.all(Array.from({ length: 6 }, () => new Client().post('/api/auth/signup', { ...adult, email })))
    expect(same.map(r => r.status)).toEqual(Array(6).fill(202))
    await waitForMail(email, /Confirm your e-mail address/)
    await waitFor(async () => (await countRows('users', 'email IN (?)', [emails])) === 20, 'twenty new accounts', 30_000)
    expect(await countRows('users', 'email = ?', [email])).toBe(1)
  })
})
