import { describe, expect, it } from 'vitest'
import { routeOfFile, routeFiles } from '../support/routes'

/** The access matrix trusts this mapping from route files to routes; a wrong one would hide a route. */
describe('route files → routes', () => {
  it.each([
    ['/s', '/s/api/flights/[id]/publish.post.ts', 'POST /api/flights/[id]/publish'],
    ['/s', '/s/api/lab-sheets/index.post.ts', 'POST /api/lab-sheets'],
    ['/s', '/s/api/account/index.get.ts', 'GET /api/account'],
    ['/s', '/s/api/days/[date].get.ts', 'GET /api/days/[date]'],
    ['/s', '/s/api/flights/[id]/pours/[position].get.ts', 'GET /api/flights/[id]/pours/[position]'],
    ['/s/routes', '/s/routes/cards/flights/[id]/card.pdf.get.ts', 'GET /cards/flights/[id]/card.pdf'],
    ['/s/routes', '/s/routes/bookings/[id]/calendar.ics.get.ts', 'GET /bookings/[id]/calendar.ics'],
    ['/s/routes', '/s/routes/reports/bookings.csv.get.ts', 'GET /reports/bookings.csv'],
  ])('%s: %s', (root, file, route) => {
    expect(routeOfFile(root, file)).toBe(route)
  })

  it('refuses a file without a method', () => {
    expect(() => routeOfFile('/s', '/s/api/flights/helpers.ts')).toThrow(/without a method/)
  })

  it('reads both route folders: JSON under /api, downloads beside the pages', () => {
    const routes = routeFiles()
    expect(routes).toContain('GET /api/days/[date]')
    expect(routes).toContain('GET /cards/flights/[id]/card.pdf')
    expect(routes).toContain('GET /cards/jobs/[jobId]/cards.pdf')
    expect(routes.filter(r => !r.split(' ')[1]!.startsWith('/api/')).every(r => r.startsWith('GET ') || r === 'POST /webhooks/stripe')).toBe(true)
  })
})
