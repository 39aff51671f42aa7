import { describe, expect, it } from 'vitest'
import { Client } from '../support/http'
import { signedIn } from '../support/people'

const page = { accept: 'text/html' }

describe('errors in their current form (status, statusText, message)', () => {
  it('an API error answers with its status, its short reason and its message', async () => {
    const res = await new Client().get('/api/sessions/999999999/availability')
    expect(res.status).toBe(404)
    expect(res.body).toMatchObject({ statusCode: 404, statusMessage: 'Not found', message: 'No such session.' })
    const signedOut = await new Client().get('/api/days/2026-12-02')
    expect(signedOut.status).toBe(401)
    expect(signedOut.body).toMatchObject({ statusCode: 401, statusMessage: 'Sign in first', message: 'Sign in to continue.' })
  })

  it('an unknown page renders the error page with its title and the message', async () => {
    const res = await new Client().request<string>('GET', '/no-such-page-here', undefined, page)
    expect(res.status).toBe(404)
    expect(res.body).toContain('Error 404')
    expect(res.body).toContain('Page not found')
    expect(res.body).toContain('/no-such-page-here')
  })

  it('a page that throws while rendering on the server shows its own message', async () => {
    const host = await signedIn('host')
    const res = await host.request<string>('GET', '/manage/products/999999999', undefined, page)
    expect(res.status).toBe(404)
    expect(res.body).toContain('Page not found')
    expect(res.body).toContain('No such product.')
  })
})
