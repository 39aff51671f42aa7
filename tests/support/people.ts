import { expect } from 'vitest'
import { Client } from './http'
import { DEMO_PASSWORD } from '../../server/demo/data'

/** A client signed in as one of the demo accounts of the test database. */
export async function signedIn(role: 'manager' | 'host' | 'marketing' | 'guest'): Promise<Client> {
  const c = new Client()
  const res = await c.signIn(`${role}@saltmarsh.test`, DEMO_PASSWORD)
  expect(res.status, `sign in as ${role}`).toBe(200)
  return c
}
