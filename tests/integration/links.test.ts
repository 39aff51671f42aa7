import { describe, expect, it } from 'vitest'
import { Client, uniqueEmail } from '../support/http'
import { linkToken, waitForMail } from '../support/mail'
import { countRows, withDb } from '../support/db'
import { DEMO_PASSWORD } from '../../server/demo/data'

async function manager() {
  const c = new Client()
  expect((await c.signIn('manager@saltmarsh.test', DEMO_PASSWORD)).status).toBe(200)
  return c
}

async function expireTokensOf(email: string) {
  await withDb(c => c.query('UPDATE auth_tokens t JOIN users u ON u.id = t.user_id SET t.expires_at = UTC_TIMESTAMP(3) - INTERVAL 1 MINUTE WHERE u.email = ?', [email]))
}

describe('staff invitations', () => {
  it('e-mails a one-time link that sets the password, signs in with the role, and cannot be reused', async () => {
    const m = await manager()
    const email = uniqueEmail('newhost')
    const invited = await m.post('/api/staff', { name: 'Ansel Hart', email, role: 'host' })
    expect(invited.status).toBe(201)
    const staff = (await m.get('/api/staff')).body as { email: string, invitationPending: boolean }[]
    expect(staff.find(s => s.email === email)?.invitationPending).toBe(true)

    const mail = await waitForMail(email, /invited/)
    expect(mail.text).toContain('as host')
    const token = linkToken(mail, '/welcome')

    const before = new Client()
    expect((await before.signIn(email, 'anything-at-all')).status).toBe(401)

    const newcomer = new Client()
    const accepted = await newcomer.post('/api/auth/invitation', { token, password: 'host-password-1' })
    expect(accepted.status).toBe(200)
    expect(accepted.body.user).toMatchObject({ email, role: 'host' })
    expect((await newcomer.get('/api/account')).body.role).toBe('host')

    const again = await new Client().post('/api/auth/invitation', { token, password: 'another-password' })
    expect(again.status).toBe(410)
    expect(again.body.message).toMatch(/already been used/)
    expect((await new Client().signIn(email, 'host-password-1')).status).toBe(200)
  })

  it('refuses an expired invitation and a resent link replaces the old one', async () => {
    const m = await manager()
    const email = uniqueEmail('late')
    const created = await m.post('/api/staff', { name: 'Bea Lowell', email, role: 'marketing' })
    const first = linkToken(await waitForMail(email, /invited/), '/welcome')
    await expireTokensOf(email)
    const expired = await new Client().post('/api/auth/invitation', { token: first, password: 'marketing-pass-1' })
    expect(expired.status).toBe(410)
    expect(expired.body.message).toMatch(/expired/)

    expect((await m.post(`/api/staff/${created.body.id}/invitation`)).status).toBe(200)
    const second = linkToken(await waitForMail(email, /invited/, { count: 2 }), '/welcome')
    expect(second).not.toBe(first)
    expect((await new Client().post('/api/auth/invitation', { token: second, password: 'marketing-pass-1' })).status).toBe(200)
  })

  it('answers 400 to a token that was never issued and to a malformed one', async () => {
    const unknown = await new Client().post('/api/auth/invitation', { token: 'A'.repeat(43), password: 'whatever-password' })
    expect(unknown.status).toBe(400)
    expect(unknown.body.message).toMatch(/not valid/)
    const malformed = await new Client().post('/api/auth/invitation', { token: '../../etc', password: 'whatever-password' })
    expect(malformed.status).toBe(400)
    expect(malformed.body.data.fields.token).toMatch(/not valid/)
  })

  it('refuses a duplicate e-mail and an unknown role, writing nothing', async () => {
    const m = await manager()
    const before = await countRows('users')
    const dup = await m.post('/api/staff', { name: 'Again', email: 'host@saltmarsh.test', role: 'host' })
    expect(dup.status).toBe(409)
    const role = await m.post('/api/staff', { name: 'Root', email: uniqueEmail('root'), role: 'owner' })
    expect(role.status).toBe(400)
    expect(role.body.data.fields.role).toMatch(/manager, host, marketing/)
    const guestRole = await m.post('/api/staff', { name: 'G', email: uniqueEmail('g'), role: 'guest' })
    expect(guestRole.status).toBe(400)
    expect(await countRows('users')).toBe(before)
  })
})

describe('password reset', () => {
  it('e-mails a link; the new password works, the old one stops, and the link works once', async () => {
    const email = uniqueEmail('forgot')
    await new Client().post('/api/auth/signup', { name: 'Ida Brook', email, password: 'old-password-123', dateOfBirth: '1985-02-02' })
    await waitForMail(email, /Confirm your e-mail address/)
    const req = await new Client().post('/api/auth/password-reset', { email })
    expect(req.status).toBe(200)
    const token = linkToken(await waitForMail(email, /Reset your/), '/reset-password')

    const done = await new Client().post('/api/auth/password-reset/confirm', { token, password: 'new-password-456' })
    expect(done.status).toBe(200)
    expect((await new Client().signIn(email, 'old-password-123')).status).toBe(401)
    expect((await new Client().signIn(email, 'new-password-456')).status).toBe(200)
    const reuse = await new Client().post('/api/auth/password-reset/confirm', { token, password: 'third-password-789' })
    expect(reuse.status).toBe(410)
    expect(reuse.body.message).toMatch(/already been used/)
  })

  it('refuses an expired reset link', async () => {
    const email = uniqueEmail('stale')
    await new Client().post('/api/auth/signup', { name: 'Jon Stale', email, password: 'old-password-123', dateOfBirth: '1985-02-02' })
    await waitForMail(email, /Confirm your e-mail address/)
    await new Client().post('/api/auth/password-reset', { email })
    const token = linkToken(await waitForMail(email, /Reset your/), '/reset-password')
    await expireTokensOf(email)
    const res = await new Client().post('/api/auth/password-reset/confirm', { token, password: 'new-password-456' })
    expect(res.status).toBe(410)
    expect(res.body.message).toMatch(/expired/)
    expect((await new Client().signIn(email, 'old-password-123')).status).toBe(200)
  })

  it('answers an unknown address exactly as a known one, and sends nothing', async () => {
    const email = uniqueEmail('ghost')
    const res = await new Client().post('/api/auth/password-reset', { email })
    expect(res.status).toBe(200)
    expect(res.body.message).toMatch(/If an account exists/)
    expect(await countRows('outbox', 'to_address = ?', [email])).toBe(0)
  })

  it('a reset too short is refused with a field message', async () => {
    const res = await new Client().post('/api/auth/password-reset/confirm', { token: 'B'.repeat(43), password: 'short' })
    expect(res.status).toBe(400)
    expect(res.body.data.fields.password).toMatch(/at least 10/)
  })
})
