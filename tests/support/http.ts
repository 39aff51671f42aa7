import { inject } from 'vitest'

export interface Reply<T = any> { status: number, body: T, headers: Headers }

/**
 * A tiny HTTP client with its own cookie jar, one per simulated person. Each client also claims its
 * own client address through X-Forwarded-For (the test server trusts it), so per-address sign-in
 * throttling in one test does not leak into another.
 */
export class Client {
  private cookies = new Map<string, string>()
  constructor(readonly ip = `10.${rnd()}.${rnd()}.${rnd()}`) {}

  /** Sends a request with this person's cookies and returns the response unread (streams, PDFs, images). */
  async send(method: string, path: string, body?: unknown, headers: Record<string, string> = {}): Promise<Response> {
    const raw = body === undefined || typeof body === 'string' || body instanceof FormData
    const res = await fetch(`${inject('appUrl')}${path}`, {
      method,
      redirect: 'manual',
      headers: {
        'x-forwarded-for': this.ip,
        ...(raw ? {} : { 'content-type': 'application/json' }),
        ...(this.cookies.size ? { cookie: [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ') } : {}),
        ...headers,
      },
      body: body === undefined ? undefined : raw ? body as string | FormData : JSON.stringify(body),
    })
    for (const c of res.headers.getSetCookie()) {
      const [pair = ''] = c.split(';')
      const [name = '', ...value] = pair.split('=')
      if (/max-age=0|expires=Thu, 01 Jan 1970/i.test(c)) this.cookies.delete(name)
      else this.cookies.set(name, value.join('='))
    }
    return res
  }

  async request<T = any>(method: string, path: string, body?: unknown, headers: Record<string, string> = {}): Promise<Reply<T>> {
    const res = await this.send(method, path, body, headers)
    const text = await res.text()
    let parsed: unknown = text
    try { parsed = JSON.parse(text) }
    catch { /* not JSON */ }
    return { status: res.status, body: parsed as T, headers: res.headers }
  }

  /** A GET whose body is binary (PDF, CSV, images): the raw Response. */
  raw = (path: string) => this.send('GET', path)
  get = <T = any>(path: string) => this.request<T>('GET', path)
  post = <T = any>(path: string, body?: unknown, headers?: Record<string, string>) => this.request<T>('POST', path, body ?? {}, headers)
  patch = <T = any>(path: string, body?: unknown) => this.request<T>('PATCH', path, body ?? {})

  /** Another client carrying a copy of this one's cookies (a stolen or copied cookie), from another address. */
  copy(): Client {
    const other = new Client()
    for (const [k, v] of this.cookies) other.cookies.set(k, v)
    return other
  }

  async signIn(email: string, password: string): Promise<Reply> {
    return this.post('/api/auth/signin', { email, password })
  }
}

function rnd() { return Math.floor(Math.random() * 250) + 1 }

export const uniqueEmail = (tag: string) => `${tag}-${Date.now().toString(36)}-${Math.random().toString(36).slice(2, 7)}@example.test`

/**
 * Every product of the venue as GET /api/products lists them, page by page (a test that needs one by
 * its code or name reads the whole catalogue this way, not by assuming it fits one page).
 */
export async function allProducts<T = any>(c: Client): Promise<T[]> {
  const out: T[] = []
  for (let page = 1; ; page++) {
    const res = await c.get<{ items: T[], total: number }>(`/api/products?pageSize=100&page=${page}`)
    if (res.status !== 200) throw new Error(`GET /api/products answered ${res.status}`)
    out.push(...res.body.items)
    if (out.length >= res.body.total || !res.body.items.length) return out
  }
}

/** The id of the product with this code (found by the list's own search). */
export async function productIdByCode(c: Client, code: string): Promise<number> {
  const res = await c.get<{ items: { id: number, code: string }[] }>(`/api/products?q=${encodeURIComponent(code)}`)
  const found = res.body.items?.find(p => p.code === code)
  if (!found) throw new Error(`no product with the code ${code}`)
  return found.id
}
