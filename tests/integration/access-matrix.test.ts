import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { Client, uniqueEmail } from '../support/http'
import { signedIn } from '../support/people'
import { bookAndPay, bookingBody, checkoutIdOf, demoFlightId, newGuest, newSession } from '../support/booking'
import { PRODUCT_COLUMNS, productRow, runTag, toCsv } from '../support/labSheets'
import { routeFiles } from '../support/routes'

/**
 * Every route × every role → the status it must answer. One row per method and path, with a body
 * the route would accept from the right person; a route file without a row fails the last test.
 * The booking owner goes last so that routes which end a booking (release, cancel) first prove that
 * nobody else can reach it.
 */
type RoleName = 'anonymous' | 'guest' | 'otherGuest' | 'host' | 'marketing' | 'manager'
const RUN_ORDER: RoleName[] = ['anonymous', 'otherGuest', 'host', 'marketing', 'manager', 'guest']

interface Fixtures {
  flightId: number
  productId: number
  glassId: number
  hostId: number
  invitedId: number
  session: number
  cancelSession: number
  heldBooking: number
  paidBooking: number
  paidReference: string
  guestDateOfBirth: string
  draftFlight: () => Promise<number>
  publishedFlight: () => Promise<number>
  freshSession: () => Promise<number>
}

type Expect = Record<RoleName, number>
interface Row {
  route: string
  path: (f: Fixtures) => string | Promise<string>
  body?: (f: Fixtures, role: RoleName) => unknown
  expect: Expect
  /** Each role uses a freshly signed-in client (routes that change the caller's own session). */
  fresh?: boolean
  /** A new target for each role (routes that use their target up). */
  perRole?: boolean
  /** The route ends every sign-in of the caller's account: everybody signs in again afterwards. */
  endsSessions?: boolean
}

const all = (s: number): Expect => ({ anonymous: s, guest: s, otherGuest: s, host: s, marketing: s, manager: s })
const signedInAll = (s: number): Expect => ({ ...all(s), anonymous: 401 })
const only = (ok: Partial<Record<RoleName, number>>): Expect => ({ anonymous: 401, guest: 403, otherGuest: 403, host: 403, marketing: 403, manager: 403, ...ok })
const manager = (s: number) => only({ manager: s })
const staff = (s: number) => only({ host: s, marketing: s, manager: s })
const editors = (s: number) => only({ marketing: s, manager: s })
/** Routes of one guest's own booking: everybody else, staff included, is told it does not exist. */
const owner = (s: number): Expect => ({ anonymous: 401, guest: s, otherGuest: 404, host: 404, marketing: 404, manager: 404 })

const pourOf = (f: Fixtures, volumeMl = 40) => ({ productId: f.productId, volumeMl, glassId: f.glassId, servingTempC: 12 })
const flightBody = (f: Fixtures) => ({ name: `Matrix flight ${runTag()}`, summary: 'Access matrix', pours: [pourOf(f), pourOf(f, 30)] })
const measurement = { abvPctVol: 12.5, residualSugarGL: 2, lab: 'Matrix Lab', method: 'Ebulliometry', measuredOn: '2026-10-01' }
const productBody = () => ({
  code: `MX-${runTag()}`, kind: 'still_wine', name: 'Matrix Cuvée', producer: 'Matrix Cellar', servingTempC: 10,
  allergens: ['sulfites'], bottleSizeMl: 750, costPerBottleMinor: 1450, measurement,
})
const glassBody = { name: 'Matrix tulip', bowlDiameterMm: 70, wallAngleDeg: 70, fillHeightMm: 30 }
const future = (days: number) => new Date(Date.now() + days * 86_400_000).toISOString().slice(0, 10)

const ROUTES: Row[] = [
  // Accounts and sign-in
  { route: 'GET /api/account', path: () => '/api/account', expect: signedInAll(200) },
  { route: 'POST /api/auth/signin', path: () => '/api/auth/signin', body: () => ({ email: uniqueEmail('nobody'), password: 'not-the-password' }), expect: all(401) },
  { route: 'POST /api/auth/signout', path: () => '/api/auth/signout', expect: all(200), fresh: true },
  { route: 'POST /api/auth/signout-everywhere', path: () => '/api/auth/signout-everywhere', expect: signedInAll(200), fresh: true, endsSessions: true },
  { route: 'POST /api/auth/verify-email', path: () => '/api/auth/verify-email', body: () => ({ token: 'v'.repeat(43) }), expect: all(400) },
  // Both guests' addresses are confirmed already.
  { route: 'POST /api/account/address-check', path: () => '/api/account/address-check', expect: only({ guest: 409, otherGuest: 409 }) },
  { route: 'POST /api/auth/signup', path: () => '/api/auth/signup', body: () => ({ name: 'Matrix Guest', email: uniqueEmail('matrix'), password: 'guest-password-1', dateOfBirth: '1990-05-14' }), expect: all(202), fresh: true },
  { route: 'POST /api/auth/invitation', path: () => '/api/auth/invitation', body: () => ({ token: 'x'.repeat(43), password: 'staff-password-1' }), expect: all(400) },
  { route: 'POST /api/auth/password-reset', path: () => '/api/auth/password-reset', body: () => ({ email: 'nobody@example.test' }), expect: all(200) },
  { route: 'POST /api/auth/password-reset/confirm', path: () => '/api/auth/password-reset/confirm', body: () => ({ token: 'y'.repeat(43), password: 'guest-password-1' }), expect: all(400) },
  // Public reading
  { route: 'GET /api/health', path: () => '/api/health', expect: all(200) },
  { route: 'GET /api/ping', path: () => '/api/ping', expect: all(200) },
  { route: 'GET /api/venue', path: () => '/api/venue', expect: all(200) },
  { route: 'GET /api/venue/photo', path: () => '/api/venue/photo', expect: all(200) },
  { route: 'GET /sitemap.xml', path: () => '/sitemap.xml', expect: all(200) },
  { route: 'GET /robots.txt', path: () => '/robots.txt', expect: all(200) },
  { route: 'GET /api/articles', path: () => '/api/articles', expect: all(200) },
  { route: 'GET /api/articles/[slug]', path: () => '/api/articles/tasting-a-flight', expect: all(200) },
  { route: 'GET /api/flights', path: () => '/api/flights', expect: all(200) },
  { route: 'GET /api/flights/published', path: () => '/api/flights/published', expect: all(200) },
  { route: 'GET /api/flights/[id]', path: f => `/api/flights/${f.flightId}`, expect: all(200) },
  { route: 'GET /api/flights/[id]/sessions', path: f => `/api/flights/${f.flightId}/sessions`, expect: all(200) },
  { route: 'GET /api/flights/[id]/pours/[position]', path: f => `/api/flights/${f.flightId}/pours/1`, expect: all(200) },
  { route: 'GET /api/flights/[id]/pours/[position]/observations', path: f => `/api/flights/${f.flightId}/pours/1/observations`, expect: all(200) },
  { route: 'GET /api/observations/challenge', path: () => '/api/observations/challenge', expect: all(200) },
  // Public, but without a solved bot check every caller is refused alike (the field is checked first: 400).
  { route: 'POST /api/observations', path: () => '/api/observations', body: f => ({ flightId: f.flightId, position: 1, tearsFormed: 'yes', minutesSince: 3, since: 'swirl' }), expect: all(400) },
  { route: 'GET /api/sessions/[id]/availability', path: f => `/api/sessions/${f.session}/availability`, expect: all(200) },
  { route: 'GET /api/science/curve', path: () => '/api/science/curve?tempC=12', expect: all(200) },
  { route: 'GET /api/science/film', path: () => '/api/science/film?abv=12.5&tempC=12', expect: all(200) },
  { route: 'GET /api/science/products', path: () => '/api/science/products', expect: all(200) },
  { route: 'GET /media/[name]', path: () => '/media/0000000000000000.webp', expect: all(404) },
  { route: 'POST /webhooks/stripe', path: () => '/webhooks/stripe', body: () => ({ id: 'evt_forged', type: 'checkout.session.completed' }), expect: all(400) },
  // A guest's own bookings
  { route: 'GET /api/bookings', path: () => '/api/bookings', expect: signedInAll(200) },
  { route: 'POST /api/bookings', path: () => '/api/bookings', body: (f, role) => bookingBody(f.session, { email: 'matrix@example.test', name: 'Matrix Guest', dateOfBirth: role === 'guest' ? f.guestDateOfBirth : '1990-05-14' }, 1), expect: only({ guest: 201, otherGuest: 201 }) },
  { route: 'GET /api/bookings/[id]', path: f => `/api/bookings/${f.heldBooking}`, expect: owner(200) },
  { route: 'GET /bookings/[id]/calendar.ics', path: f => `/bookings/${f.paidBooking}/calendar.ics`, expect: owner(200) },
  { route: 'GET /bookings/[id]/qr.svg', path: f => `/bookings/${f.paidBooking}/qr.svg`, expect: owner(200) },
  { route: 'POST /api/bookings/[id]/release', path: f => `/api/bookings/${f.heldBooking}/release`, expect: owner(200) },
  { route: 'POST /api/bookings/[id]/cancel', path: f => `/api/bookings/${f.paidBooking}/cancel`, expect: owner(200) },
  // Staff reading
  { route: 'GET /api/products', path: () => '/api/products', expect: staff(200) },
  { route: 'GET /api/products/[id]', path: f => `/api/products/${f.productId}`, expect: staff(200) },
  { route: 'GET /api/glasses', path: () => '/api/glasses', expect: staff(200) },
  { route: 'GET /api/sessions', path: () => '/api/sessions', expect: staff(200) },
  { route: 'GET /api/sessions/[id]', path: f => `/api/sessions/${f.session}`, expect: staff(200) },
  // The host's day: only the session's host or a manager; the matrix session has no host and is
  // not today, so a manager passes the guard and meets the day rule (409).
  { route: 'GET /api/days/[date]', path: () => `/api/days/${future(0)}`, expect: only({ host: 200, manager: 200 }) },
  { route: 'POST /api/bookings/[id]/check-in', path: f => `/api/bookings/${f.paidBooking}/check-in`, body: () => ({ seated: 1, idsSeen: 1 }), expect: only({ manager: 409 }) },
  { route: 'POST /api/bookings/[id]/turn-away', path: f => `/api/bookings/${f.paidBooking}/turn-away`, body: () => ({ reason: 'No photo ID' }), expect: only({ manager: 409 }) },
  { route: 'POST /api/bookings/[id]/no-show', path: f => `/api/bookings/${f.paidBooking}/no-show`, expect: only({ manager: 409 }) },
  // The paid booking was cancelled above: a manager may take back a door decision, but there is none to take back.
  { route: 'POST /api/bookings/[id]/undo-door', path: f => `/api/bookings/${f.paidBooking}/undo-door`, expect: only({ manager: 409 }) },
  // Typed in lower case with a space and a dash, as a host might; the matrix session has no host, so only a manager finds it.
  { route: 'GET /api/bookings/by-reference/[reference]', path: f => `/api/bookings/by-reference/${encodeURIComponent(`${f.paidReference.slice(0, 5).toLowerCase()} -${f.paidReference.slice(5)}`)}`, expect: only({ manager: 200 }) },
  { route: 'POST /api/sessions/[id]/walk-ins', path: f => `/api/sessions/${f.session}/walk-ins`, body: () => ({ contactName: 'Matrix Walk-in', partySize: 1, idsSeen: 1 }), expect: only({ manager: 409 }) },
  // The room's air for a session: the demo host does not run the matrix session (403); a manager passes the guard and meets the day rule (409).
  { route: 'PUT /api/sessions/[id]/room-reading', path: f => `/api/sessions/${f.session}/room-reading`, body: () => ({ relativeHumidityPct: 55, airTempC: 21 }), expect: only({ manager: 409 }) },
  // Observations of a session: the demo host does not run the matrix session (403); a manager may, but the matrix session is days ahead (409 on recording).
  { route: 'GET /api/sessions/[id]/observations', path: f => `/api/sessions/${f.session}/observations`, expect: only({ manager: 200 }) },
  { route: 'POST /api/sessions/[id]/observations', path: f => `/api/sessions/${f.session}/observations`, body: () => ({ position: 1, tearsFormed: 'yes', minutesSince: 3, since: 'swirl', relativeHumidityPct: 55, airTempC: 21 }), expect: only({ manager: 409 }) },
  { route: 'GET /api/sessions/[id]/cards', path: f => `/api/sessions/${f.session}/cards`, expect: only({ manager: 200 }) },
  // The matrix session has no paid party of its own, so the job is refused as empty (409).
  { route: 'POST /api/sessions/[id]/card-jobs', path: f => `/api/sessions/${f.session}/card-jobs`, body: () => ({ paper: 'a5', names: false }), expect: only({ manager: 409 }) },
  { route: 'GET /api/card-jobs/[jobId]', path: () => '/api/card-jobs/00000000-0000-4000-8000-000000000000', expect: only({ host: 404, manager: 404 }) },
  { route: 'GET /cards/jobs/[jobId]/cards.pdf', path: () => '/cards/jobs/00000000-0000-4000-8000-000000000000/cards.pdf', expect: only({ host: 404, manager: 404 }) },
  { route: 'GET /api/flights/[id]/card', path: f => `/api/flights/${f.flightId}/card`, expect: staff(200) },
  { route: 'GET /cards/flights/[id]/card.pdf', path: f => `/cards/flights/${f.flightId}/card.pdf?paper=a5`, expect: staff(200) },
  { route: 'GET /api/images', path: f => `/api/images?productId=${f.productId}`, expect: staff(200) },
  // Notes and articles
  { route: 'GET /api/content', path: () => '/api/content', expect: editors(200) },
  { route: 'GET /api/content/[kind]/[subject]', path: f => `/api/content/product_note/${f.productId}`, expect: editors(200) },
  { route: 'GET /api/content/[kind]/[subject]/revisions', path: f => `/api/content/product_note/${f.productId}/revisions`, expect: editors(200) },
  { route: 'PUT /api/content/[kind]/[subject]', path: f => `/api/content/product_note/${f.productId}`, body: () => ({ body: 'Pear and *sea spray*.' }), expect: editors(200) },
  { route: 'POST /api/content/[kind]/[subject]/publish', path: f => `/api/content/product_note/${f.productId}/publish`, expect: editors(200) },
  { route: 'POST /api/content/[kind]/[subject]/unpublish', path: f => `/api/content/product_note/${f.productId}/unpublish`, expect: editors(200) },
  { route: 'POST /api/content/[kind]/[subject]/restore', path: f => `/api/content/product_note/${f.productId}/restore`, body: () => ({ revisionId: 999_999_999 }), expect: editors(404) },
  { route: 'POST /api/images', path: () => '/api/images', body: () => imageForm(), expect: editors(400) },
  { route: 'DELETE /api/images/[id]', path: () => '/api/images/999999999', expect: editors(404) },
  // The manager's work
  { route: 'GET /api/reports/overview', path: () => '/api/reports/overview', expect: manager(200) },
  { route: 'GET /api/reports/bookings', path: () => '/api/reports/bookings', expect: manager(200) },
  { route: 'GET /reports/bookings.csv', path: () => '/reports/bookings.csv', expect: manager(200) },
  // Predicted against observed is the manager's: hosts record readings but do not read the analysis or the export.
  { route: 'GET /api/observations', path: () => '/api/observations', expect: manager(200) },
  { route: 'GET /api/observations/summary', path: () => '/api/observations/summary', expect: manager(200) },
  { route: 'GET /api/observations/export.csv', path: () => '/api/observations/export.csv', expect: manager(200) },
  { route: 'GET /api/staff', path: () => '/api/staff', expect: manager(200) },
  { route: 'POST /api/staff', path: () => '/api/staff', body: () => ({ name: 'Matrix Host', email: uniqueEmail('matrix-host'), role: 'host' }), expect: manager(201) },
  { route: 'PATCH /api/staff/[id]', path: f => `/api/staff/${f.hostId}`, body: () => ({ role: 'host' }), expect: manager(200) },
  { route: 'POST /api/staff/[id]/invitation', path: f => `/api/staff/${f.invitedId}/invitation`, expect: manager(200) },
  { route: 'PATCH /api/venue', path: () => '/api/venue', body: () => venueSettings, expect: manager(200) },
  { route: 'PATCH /api/venue/calibration', path: () => '/api/venue/calibration', body: () => ({ enabled: true }), expect: manager(200) },
  { route: 'POST /api/products', path: () => '/api/products', body: productBody, expect: manager(201) },
  { route: 'PATCH /api/products/[id]', path: f => `/api/products/${f.productId}`, body: () => ({ producer: 'Matrix Cellar' }), expect: manager(200) },
  { route: 'POST /api/products/[id]/measurements', path: f => `/api/products/${f.productId}/measurements`, body: () => measurement, expect: manager(201) },
  { route: 'POST /api/lab-sheets/check', path: () => '/api/lab-sheets/check', body: () => ({ sheet: 'products', csv: toCsv([productRow(`MXI-${runTag()}`)], PRODUCT_COLUMNS) }), expect: manager(200) },
  { route: 'POST /api/lab-sheets', path: () => '/api/lab-sheets', body: () => ({ sheet: 'products', csv: toCsv([productRow(`MXC-${runTag()}`)], PRODUCT_COLUMNS), lines: [2] }), expect: manager(201) },
  { route: 'POST /api/glasses', path: () => '/api/glasses', body: () => ({ ...glassBody, name: `Matrix tulip ${runTag()}` }), expect: manager(201) },
  { route: 'PATCH /api/glasses/[id]', path: f => `/api/glasses/${f.glassId}`, body: () => glassOriginal, expect: manager(200) },
  { route: 'POST /api/flights', path: () => '/api/flights', body: flightBody, expect: manager(201) },
  { route: 'POST /api/flights/preview', path: () => '/api/flights/preview', body: f => ({ pours: [pourOf(f)] }), expect: manager(200) },
  { route: 'PATCH /api/flights/[id]', path: f => f.draftFlight().then(id => `/api/flights/${id}`), body: () => ({ summary: 'Changed by the matrix' }), expect: manager(200), perRole: true },
  { route: 'POST /api/flights/[id]/publish', path: f => f.draftFlight().then(id => `/api/flights/${id}/publish`), expect: manager(200), perRole: true },
  { route: 'POST /api/flights/[id]/unpublish', path: f => f.publishedFlight().then(id => `/api/flights/${id}/unpublish`), expect: manager(200), perRole: true },
  { route: 'POST /api/flights/[id]/retire', path: f => f.publishedFlight().then(id => `/api/flights/${id}/retire`), expect: manager(200), perRole: true },
  { route: 'POST /api/flights/[id]/revise', path: f => f.publishedFlight().then(id => `/api/flights/${id}/revise`), expect: manager(201), perRole: true },
  { route: 'POST /api/sessions', path: () => '/api/sessions', body: f => ({ flightId: f.flightId, startDate: future(200), startTime: '18:30', durationMinutes: 60, seats: 6, priceMinor: 2500 }), expect: manager(201) },
  { route: 'PATCH /api/sessions/[id]', path: f => `/api/sessions/${f.session}`, body: () => ({ seats: 40 }), expect: manager(200) },
  { route: 'POST /api/sessions/[id]/cancel', path: f => f.freshSession().then(id => `/api/sessions/${id}/cancel`), expect: manager(200), perRole: true },
]

let venueSettings: Record<string, unknown>
let glassOriginal: Record<string, unknown>

function imageForm(): FormData {
  const form = new FormData()
  form.append('file', new Blob(['not an image'], { type: 'image/png' }), 'label.png')
  return form
}

describe('access matrix', () => {
  const people = {} as Record<RoleName, Client>
  const fx = {} as Fixtures

  async function signInAs(role: RoleName): Promise<Client> {
    if (role === 'anonymous') return new Client()
    if (role === 'otherGuest') {
      const c = new Client()
      expect((await c.signIn(otherGuestEmail, 'guest-password-1')).status).toBe(200)
      return c
    }
    return signedIn(role)
  }
  let otherGuestEmail = ''

  beforeAll(async () => {
    people.anonymous = new Client()
    people.guest = await signedIn('guest')
    const other = await newGuest('matrix-other')
    otherGuestEmail = other.email
    people.otherGuest = other.client
    people.host = await signedIn('host')
    people.marketing = await signedIn('marketing')
    people.manager = await signedIn('manager')
    const m = people.manager

    fx.flightId = await demoFlightId()
    const product = await m.post('/api/products', productBody())
    expect(product.status).toBe(201)
    fx.productId = product.body.id
    const glasses = (await m.get('/api/glasses')).body as { id: number, name: string, bowlDiameterMm: number, wallAngleDeg: number, fillHeightMm: number }[]
    const glass = glasses[0]!
    fx.glassId = glass.id
    glassOriginal = { name: glass.name, bowlDiameterMm: glass.bowlDiameterMm, wallAngleDeg: glass.wallAngleDeg, fillHeightMm: glass.fillHeightMm }
    const staffList = (await m.get('/api/staff')).body as { id: number, email: string }[]
    fx.hostId = staffList.find(s => s.email === 'host@saltmarsh.test')!.id
    const invited = await m.post('/api/staff', { name: 'Matrix Invitee', email: uniqueEmail('matrix-invitee'), role: 'marketing' })
    expect(invited.status).toBe(201)
    fx.invitedId = invited.body.id
    const { id: _id, ...settings } = (await m.get('/api/venue')).body
    venueSettings = settings

    fx.session = (await newSession(m, { seats: 40 })).id
    const demoGuest = { client: people.guest, email: 'guest@saltmarsh.test', name: 'Demo Guest', dateOfBirth: '1990-05-14' }
    const account = (await people.guest.get('/api/account')).body
    Object.assign(demoGuest, { name: account.name, dateOfBirth: account.dateOfBirth ?? demoGuest.dateOfBirth })
    // The hold is in a session of its own: asking again for a session one holds answers with that hold.
    const heldSession = (await newSession(m, { seats: 40 })).id
    const held = await people.guest.post('/api/bookings', bookingBody(heldSession, demoGuest, 1))
    expect(held.status, JSON.stringify(held.body)).toBe(201)
    expect(checkoutIdOf(held.body.checkoutUrl)).toBeTruthy()
    fx.heldBooking = held.body.booking.id
    fx.guestDateOfBirth = demoGuest.dateOfBirth
    const paid = await bookAndPay(demoGuest, fx.session, 1)
    fx.paidBooking = paid.id
    fx.paidReference = paid.reference

    // The manager is looked up each time: a row that ends sessions signs everybody in afresh.
    const newFlight = async () => {
      const res = await people.manager.post('/api/flights', flightBody(fx))
      expect(res.status, JSON.stringify(res.body)).toBe(201)
      return res.body.id as number
    }
    fx.draftFlight = newFlight
    fx.publishedFlight = async () => {
      const id = await newFlight()
      expect((await people.manager.post(`/api/flights/${id}/publish`)).status).toBe(200)
      return id
    }
    fx.freshSession = async () => (await newSession(people.manager, { seats: 4 })).id
  })

  afterAll(async () => {
    // The flights this matrix published are retired, so guests' lists show the demo's again.
    for (const f of (await people.manager.get('/api/flights')).body as { id: number, name: string, status: string }[]) {
      if (f.name.startsWith('Matrix flight') && f.status === 'published') await people.manager.post(`/api/flights/${f.id}/retire`)
    }
  })

  it.each(ROUTES.map(r => [r.route, r] as const))('%s', async (_route, row) => {
    const shared = row.perRole ? undefined : await row.path(fx)
    const seen: Partial<Record<RoleName, number>> = {}
    for (const role of RUN_ORDER) {
      const client = row.fresh ? await signInAs(role) : people[role]
      const path = shared ?? await row.path(fx)
      const [method] = row.route.split(' ')
      const res = await client.request(method!, path, row.body?.(fx, role) ?? (method === 'GET' || method === 'DELETE' ? undefined : {}))
      seen[role] = res.status
      if (res.status >= 400) expect(typeof res.body === 'object' ? res.body.message : res.body, `${role}: ${row.route} says why`).toBeTruthy()
    }
    if (row.endsSessions) for (const role of RUN_ORDER) people[role] = await signInAs(role)
    expect(seen).toEqual(row.expect)
  })

  it('every state-changing route refuses a request from another site, whoever sends it', async () => {
    for (const row of ROUTES.filter(r => !r.route.startsWith('GET ') && !r.perRole && !r.fresh)) {
      const [method] = row.route.split(' ')
      for (const role of ['guest', 'manager'] as const) {
        const res = await people[role].request(method!, await row.path(fx), row.body?.(fx, role) ?? {}, { origin: 'https://elsewhere.example' })
        expect(res.status, `${role}: ${row.route}`).toBe(403)
      }
    }
  })

  it('every guarded route, called signed out with an empty body and an unknown id, answers 401 before it reads either', async () => {
    // One row per guarded route above (anonymous → 401): its address with every parameter unknown.
    const unknown: Record<string, string> = { id: '999999999', jobId: '00000000-0000-4000-8000-000000000000', reference: 'ZZZZZZZZZZ', date: '2099-12-31', kind: 'product_note', subject: '999999999', position: '99', slug: 'no-such-article' }
    const guarded = ROUTES.filter(r => r.expect.anonymous === 401 && r.expect.manager !== 401) // not sign-in itself, which says 401 to everyone
    expect(guarded.length).toBeGreaterThan(40)
    for (const row of guarded) {
      const [method, template] = row.route.split(' ') as [string, string]
      const path = template.replace(/\[(\w+)\]/g, (_, name: string) => unknown[name] ?? 'unknown')
      const res = await new Client().request(method, path, method === 'GET' ? undefined : {})
      expect(res.status, `${row.route} as ${path}`).toBe(401)
    }
  })

  it('has one row for every route file, and no row for a route that does not exist', () => {
    const inTable = [...new Set(ROUTES.map(r => r.route))].sort()
    expect(inTable).toEqual(routeFiles())
  })

  it('a guest who guesses booking ids finds nothing of anyone else: every other id is a 404', async () => {
    const max = fx.paidBooking + 5
    const mine = new Set(((await people.otherGuest.get('/api/bookings')).body as { id: number }[]).map(b => b.id))
    for (let id = Math.max(1, max - 60); id <= max; id++) {
      if (mine.has(id)) continue
      for (const path of [`/api/bookings/${id}`, `/bookings/${id}/calendar.ics`, `/bookings/${id}/qr.svg`]) {
        const res = await people.otherGuest.get(path)
        expect(res.status, path).toBe(404)
      }
    }
  })

  it('booking references are long random codes, not counters', async () => {
    const refs = ((await people.guest.get('/api/bookings')).body as { reference: string }[]).map(b => b.reference)
    expect(refs.length).toBeGreaterThanOrEqual(2)
    expect(new Set(refs).size).toBe(refs.length)
    for (const r of refs) expect(r.replace(/\W/g, '').length).toBeGreaterThanOrEqual(8) // 8 symbols of 32 = 40 bits (common practice, no source)
  })
})
