import { expect } from 'vitest'
import { Client, uniqueEmail } from './http'
import { linkToken, waitForMail } from './mail'
import { DEMO_PASSWORD } from '../../server/demo/data'
import type { StoredMail } from '../../scripts/fakes/mail'

/** A client signed in as one of the demo accounts of the test database. */
export async function signedIn(role: 'manager' | 'host' | 'marketing' | 'guest'): Promise<Client> {
  const c = new Client()
  const res = await c.signIn(`${role}@saltmarsh.test`, DEMO_PASSWORD)
  expect(res.status, `sign in as ${role}`).toBe(200)
  return c
}

/** A manager invites a new staff member at a fresh address; returns the address, the e-mail and its one-time token. */
export async function inviteStaff(manager: Client, role: 'manager' | 'host' | 'marketing', name: string): Promise<{ email: string, mail: StoredMail, token: string }> {
  const email = uniqueEmail(`invited-${role}`)
  const res = await manager.post('/api/staff', { name, email, role })
  expect(res.status, JSON.stringify(res.body)).toBe(201)
  const mail = await waitForMail(email, /invited/)
  return { email, mail, token: linkToken(mail, '/welcome') }
}

/**
 * Asks for a password reset as an anonymous visitor would and returns the reset e-mail and its
 * one-time token; `count` is the number of reset e-mails the address will then have received.
 */
export async function requestPasswordReset(email: string, count = 1): Promise<{ mail: StoredMail, token: string }> {
  const res = await new Client().post('/api/auth/password-reset', { email })
  expect(res.status, JSON.stringify(res.body)).toBe(200)
  const mail = await waitForMail(email, /Reset your/, { count })
  return { mail, token: linkToken(mail, '/reset-password') }
}
