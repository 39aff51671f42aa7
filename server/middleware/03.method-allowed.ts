import routeMethods from '#larmoir/route-methods'

/**
 * A path the server has, asked with a method it does not answer there, is a 405 with an Allow header
 * (RFC 9110 §15.5.6), not a 404 that would say the path does not exist. HEAD goes with GET.
 */
const PATTERNS = Object.entries(routeMethods).map(([route, methods]) => ({
  test: new RegExp(`^${route.split('/').map(part => (part.startsWith(':') ? '[^/]+' : part === '**' ? '.*' : part.replace(/[.*+?^${}()|[\]\\]/g, '\\$&'))).join('/')}$`),
  methods,
}))

export default defineEventHandler((event) => {
  if (event.method === 'OPTIONS') return
  const path = event.path.split('?')[0]!
  const allowed = new Set<string>()
  for (const p of PATTERNS) if (p.test.test(path)) for (const m of p.methods) allowed.add(m)
  if (!allowed.size) return
  if (allowed.has('GET')) allowed.add('HEAD')
  if (allowed.has(event.method)) return
  setResponseHeader(event, 'allow', [...allowed].sort().join(', '))
  throw createError({ status: 405, statusText: 'Method not allowed', message: `This address answers ${[...allowed].sort().join(', ')}, not ${event.method}.` })
})
