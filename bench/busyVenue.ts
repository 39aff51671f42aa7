/**
 * A busy venue's data for the growth bench (not a test): into a database already migrated and
 * seeded with the demo venue, adds five years of a busy tasting room — 2,000 products, 300 flights,
 * 20,000 sessions (four years past, one ahead), 200,000 bookings and 50,000 e-mails in the outbox —
 * with multi-row INSERTs of about 2,000 rows over one mysql2 connection. Deterministic: one seeded
 * PRNG, so two runs give the same rows (their dates move with today). Nothing is switched off: the
 * foreign keys, unique keys and the seat rule all hold; no session has more seats taken than it has.
 */
import { DateTime } from 'luxon'
import type { Connection } from 'mysql2/promise'
import { ALLERGENS, PRODUCT_KINDS, type ProductKind } from '../shared/products'
import { LIQUID_COLOURS } from '../shared/liquidColours'
import { REFERENCE_ALPHABET } from '../shared/bookings'

export const BUSY = { products: 2_000, flights: 300, sessions: 20_000, bookings: 200_000, outbox: 50_000, guests: 20_000 } as const
const BATCH = 2_000
const PAST_YEARS = 4
const SLOTS_LOCAL = ['11:00', '12:00', '13:00', '14:00', '15:00', '16:00', '17:00', '18:00', '19:00', '20:00', '21:00']

/** mulberry32: a small seeded PRNG (public domain; common practice, no source). */
function prng(seed: number) {
  let a = seed >>> 0
  const next = () => {
    a = (a + 0x6D2B79F5) >>> 0
    let t = a
    t = Math.imul(t ^ (t >>> 15), t | 1)
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61)
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296
  }
  return { next, int: (lo: number, hi: number) => lo + Math.floor(next() * (hi - lo + 1)), pick: <T>(xs: readonly T[]) => xs[Math.floor(next() * xs.length)]! }
}

/** The i-th reference: i spread over 32^10 by an odd multiplier (a bijection, so never two alike), as Crockford base32. */
function referenceOf(i: number): string {
  const span = 32n ** 10n
  let n = (BigInt(i + 1) * 0x5DEECE66Dn + 0x1F2E3D4C5Bn) % span
  let s = ''
  for (let k = 0; k < 10; k++) { s = REFERENCE_ALPHABET[Number(n % 32n)]! + s; n /= 32n }
  return s
}

async function insertMany(db: Connection, table: string, columns: string[], rows: unknown[][]): Promise<number> {
  for (let i = 0; i < rows.length; i += BATCH) {
    await db.query(`INSERT INTO ${table} (${columns.join(', ')}) VALUES ?`, [rows.slice(i, i + BATCH)])
  }
  return rows.length
}

/** The id the next insert of `table` will get: ids of a bulk insert on one connection are consecutive. */
async function nextId(db: Connection, table: string): Promise<number> {
  const [[row]] = await db.query(`SELECT COALESCE(MAX(id), 0) + 1 AS n FROM ${table}`) as unknown as [[{ n: number }]]
  return Number(row.n)
}

const WORDS_A = ['Saltgrass', 'Ledge', 'Harbour', 'Fogline', 'Kelp', 'Tidewater', 'Granite', 'Osprey', 'Driftwood', 'Lantern', 'Cove', 'Heron', 'Quarry', 'Bramble', 'Marram']
const WORDS_B = ['Reserve', 'Cuvée', 'Field Blend', 'Single Cask', 'Barrel Select', 'Dry', 'Off-Dry', 'Late Harvest', 'Farmhouse', 'Pale', 'Old Vine', 'Batch']
const PRODUCERS = ['Saltmarsh Cellars', 'North Ledge Farm', 'Pell Island Still House', 'Weir Orchard', 'Crane Brewing Co.', 'Half Moon Vineyard']
/** Typical strength and sugar of each kind (common practice, no source). */
const KIND_FACTS: Record<ProductKind, { abv: [number, number], sugar: [number, number], temp: number, bottle: number }> = {
  still_wine: { abv: [11, 14.5], sugar: [0, 12], temp: 14, bottle: 750 },
  sparkling: { abv: [10.5, 12.5], sugar: [0, 20], temp: 7, bottle: 750 },
  fortified: { abv: [17, 20], sugar: [40, 120], temp: 16, bottle: 500 },
  spirit: { abv: [38, 55], sugar: [0, 5], temp: 18, bottle: 700 },
  beer: { abv: [4, 8], sugar: [2, 20], temp: 6, bottle: 330 },
  cider: { abv: [4.5, 8], sugar: [5, 40], temp: 8, bottle: 500 },
  low_alcohol: { abv: [0.3, 1.2], sugar: [5, 40], temp: 7, bottle: 330 },
  other: { abv: [5, 15], sugar: [0, 60], temp: 12, bottle: 500 },
}

export interface BusyCounts { table: string, rows: number }

/** Fills the database behind `db` (the demo venue's) with a busy venue's data; returns rows added per table and the time taken. */
export async function fillBusyVenue(db: Connection, now = new Date()): Promise<{ counts: BusyCounts[], seconds: number }> {
  const started = performance.now()
  const r = prng(17)
  const [[venue]] = await db.query('SELECT id, time_zone AS timeZone, currency FROM venues ORDER BY id LIMIT 1') as unknown as [[{ id: number, timeZone: string, currency: string }]]
  const [glassRows] = await db.query('SELECT id FROM glasses WHERE venue_id = ?', [venue.id]) as unknown as [{ id: number }[]]
  const [hostRows] = await db.query(`SELECT id FROM users WHERE role IN ('host', 'manager')`) as unknown as [{ id: number }[]]
  const [[guestHash]] = await db.query(`SELECT password_hash AS hash FROM users WHERE role = 'guest' AND password_hash IS NOT NULL LIMIT 1`) as unknown as [[{ hash: string }]]
  const glasses = glassRows.map(g => g.id)
  const hosts = hostRows.map(h => h.id)
  const counts: BusyCounts[] = []
  const at = (d: DateTime) => d.toUTC().toJSDate()
  const today = DateTime.fromJSDate(now, { zone: venue.timeZone }).startOf('day')
  const firstDay = today.minus({ years: PAST_YEARS })

  // Guests who book (a copy of the demo guest's password hash; nobody signs in as them).
  const firstGuest = await nextId(db, 'users')
  const guests = Array.from({ length: BUSY.guests }, (_, i) => [`busy-guest-${i}@example.test`, `Busy Guest ${i}`, guestHash.hash, 'guest', `19${60 + (i % 40)}-0${1 + (i % 9)}-1${i % 10}`, at(firstDay)])
  counts.push({ table: 'users (guests)', rows: await insertMany(db, 'users', ['email', 'name', 'password_hash', 'role', 'date_of_birth', 'email_verified_at'], guests) })

  // Products, each with one lab measurement.
  const firstProduct = await nextId(db, 'products')
  const kinds: ProductKind[] = []
  const products = Array.from({ length: BUSY.products }, (_, i) => {
    const kind = r.pick(PRODUCT_KINDS)
    kinds.push(kind)
    const allergens = kind === 'beer' ? ['gluten'] : kind === 'still_wine' || kind === 'sparkling' || kind === 'fortified' ? ['sulfites'] : r.next() < 0.1 ? [r.pick(ALLERGENS)] : []
    return [venue.id, `BUSY-${String(i + 1).padStart(4, '0')}`, kind, `${r.pick(WORDS_A)} ${r.pick(WORDS_B)} ${i + 1}`, r.pick(PRODUCERS), String(2015 + (i % 10)), KIND_FACTS[kind].temp, JSON.stringify(allergens), KIND_FACTS[kind].bottle, r.next() < 0.5 ? r.pick(LIQUID_COLOURS) : null, r.int(800, 6000), i % 5 === 0 ? 'retired' : 'active', at(firstDay.plus({ days: i % 1400 }))]
  })
  counts.push({ table: 'products', rows: await insertMany(db, 'products', ['venue_id', 'code', 'kind', 'name', 'producer', 'vintage_or_batch', 'serving_temp_c', 'allergens', 'bottle_size_ml', 'colour', 'cost_per_bottle_minor', 'status', 'created_at'], products) })
  const measurements = kinds.map((kind, i) => {
    const f = KIND_FACTS[kind]
    return [firstProduct + i, Number((f.abv[0] + r.next() * (f.abv[1] - f.abv[0])).toFixed(1)), Number((f.sugar[0] + r.next() * (f.sugar[1] - f.sugar[0])).toFixed(1)), 'Harbour Analytical Lab', 'Densitometry', firstDay.plus({ days: i % 1400 }).toISODate()]
  })
  counts.push({ table: 'product_measurements', rows: await insertMany(db, 'product_measurements', ['product_id', 'abv_pct_vol', 'residual_sugar_g_l', 'lab', 'method', 'measured_on'], measurements) })

  // Flights: most of five years' worth are retired; 20 are on the public list, 30 are drafts.
  const firstFlight = await nextId(db, 'flights')
  const flightStatus = (i: number) => (i < 20 ? 'published' : i < 50 ? 'draft' : 'retired')
  const flights = Array.from({ length: BUSY.flights }, (_, i) => [venue.id, firstFlight + i, 1, `${r.pick(WORDS_A)} Flight ${i + 1}`, `Four pours from the ${r.pick(WORDS_A).toLowerCase()} shelf.`, flightStatus(i), flightStatus(i) === 'draft' ? null : at(firstDay.plus({ days: i * 4 })), at(firstDay.plus({ days: i * 4 }))])
  counts.push({ table: 'flights', rows: await insertMany(db, 'flights', ['venue_id', 'lineage_id', 'version', 'name', 'summary', 'status', 'published_at', 'created_at'], flights) })
  const pours: unknown[][] = []
  for (let f = 0; f < BUSY.flights; f++) {
    for (let p = 1; p <= 4; p++) {
      const product = (f * 4 + p * 37) % BUSY.products
      pours.push([firstFlight + f, p, firstProduct + product, kinds[product] === 'spirit' ? 15 : 60, r.pick(glasses), KIND_FACTS[kinds[product]!].temp])
    }
  }
  counts.push({ table: 'flight_pours', rows: await insertMany(db, 'flight_pours', ['flight_id', 'position', 'product_id', 'volume_ml', 'glass_id', 'serving_temp_c'], pours) })

  // Sessions: eleven a day, one an hour, over four years back and one ahead; past ones of any
  // flight, the coming ones of the published flights only. A tenth of the days are closed.
  const firstSession = await nextId(db, 'tasting_sessions')
  const sessions: { startsAt: Date, seats: number, price: number, past: boolean, cancelled: boolean }[] = []
  const sessionRows: unknown[][] = []
  for (let d = 0; sessions.length < BUSY.sessions; d++) {
    const day = firstDay.plus({ days: d })
    for (const slot of SLOTS_LOCAL) {
      if (sessions.length >= BUSY.sessions) break
      const [h, m] = slot.split(':').map(Number)
      const start = day.set({ hour: h!, minute: m! })
      const past = start < DateTime.fromJSDate(now)
      const flight = past ? r.int(0, BUSY.flights - 1) : r.int(0, 19)
      const seats = r.pick([16, 20, 24, 30])
      const price = r.pick([2500, 3500, 4500, 6000])
      const cancelled = r.next() < 0.02
      sessions.push({ startsAt: at(start), seats, price, past, cancelled })
      sessionRows.push([venue.id, firstFlight + flight, at(start), r.pick([60, 75, 90]), seats, price, venue.currency, r.pick(hosts), 60, cancelled ? 'cancelled' : past ? 'closed' : 'open', at(start.minus({ days: 30 }))])
    }
  }
  counts.push({ table: 'tasting_sessions', rows: await insertMany(db, 'tasting_sessions', ['venue_id', 'flight_id', 'starts_at', 'duration_minutes', 'seats', 'price_minor', 'currency', 'host_id', 'booking_cutoff_minutes', 'status', 'created_at'], sessionRows) })

  // Bookings: ten a session; a party that would pass the seats left is a hold that ran out instead.
  const firstBooking = await nextId(db, 'bookings')
  const bookingCols = ['venue_id', 'session_id', 'user_id', 'reference', 'state', 'party_size', 'contact_name', 'contact_email', 'contact_phone', 'notes', 'source', 'age_confirmed', 'unit_price_minor', 'amount_minor', 'currency', 'hold_expires_at', 'payment_intent_id', 'amount_paid_minor', 'amount_refunded_minor', 'end_reason', 'confirmed_at', 'cancelled_at', 'refunded_at', 'expired_at', 'checked_in_at', 'created_at']
  const checkIns: unknown[][] = []
  const events: unknown[][] = []
  let booked = 0
  let batch: unknown[][] = []
  const perSession = BUSY.bookings / BUSY.sessions
  for (let si = 0; si < sessions.length; si++) {
    const s = sessions[si]!
    let taken = 0
    for (let k = 0; k < perSession; k++) {
      const i = booked++
      const party = r.pick([1, 2, 2, 2, 3, 4, 4, 6])
      const guest = r.int(0, BUSY.guests - 1)
      const createdAt = new Date(s.startsAt.getTime() - r.int(1, 45 * 24 * 60) * 60_000)
      const x = r.next()
      let state: string
      if (s.cancelled) state = x < 0.7 ? 'refunded' : 'expired'
      // No booking is left cancelled with its refund still to make: the server would send those
      // refunds to the payment provider, which never took these payments.
      else if (s.past) state = x < 0.72 ? 'checked_in' : x < 0.78 ? 'no_show' : x < 0.89 ? 'refunded' : 'expired'
      else state = x < 0.8 ? 'confirmed' : x < 0.81 ? 'held' : x < 0.9 ? 'expired' : 'refunded'
      const takesSeats = state === 'confirmed' || state === 'checked_in' || state === 'held'
      if (takesSeats && taken + party > s.seats) state = 'expired'
      else if (takesSeats) taken += party
      const holdExpires = state === 'held' ? new Date(now.getTime() + 15 * 60_000) : new Date(createdAt.getTime() + 15 * 60_000)
      const paid = state !== 'held' && state !== 'expired'
      const amount = party * s.price
      const endReason = state === 'expired' ? 'hold_expired' : state === 'refunded' ? (s.cancelled ? 'session_cancelled' : 'guest_cancelled') : null
      const confirmedAt = paid ? new Date(createdAt.getTime() + 3 * 60_000) : null
      const cancelledAt = state === 'refunded' ? new Date(createdAt.getTime() + 86_400_000) : null
      const checkedInAt = state === 'checked_in' ? new Date(s.startsAt.getTime() - 5 * 60_000) : null
      batch.push([venue.id, firstSession + si, firstGuest + guest, referenceOf(i), state, party, `Busy Guest ${guest}`, `busy-guest-${guest}@example.test`, '+1 207 555 0100', i % 7 === 0 ? 'One guest is vegetarian.' : null, 'online', 1, s.price, amount, venue.currency,
        holdExpires, paid ? `pi_busy_${i}` : null, paid ? amount : 0, state === 'refunded' ? amount : 0, endReason, confirmedAt, cancelledAt, state === 'refunded' ? new Date(cancelledAt!.getTime() + 60_000) : null, state === 'expired' ? holdExpires : null, checkedInAt, createdAt])
      const id = firstBooking + i
      if (paid) events.push([id, 'pay', 'held', 'confirmed', confirmedAt])
      if (state === 'checked_in') {
        checkIns.push([id, hosts[0], 'arrived', party, party, null, checkedInAt])
        events.push([id, 'arrive', 'confirmed', 'checked_in', checkedInAt])
      }
      if (state === 'no_show') {
        checkIns.push([id, hosts[0], 'no_show', 0, 0, null, new Date(s.startsAt.getTime() + 30 * 60_000)])
        events.push([id, 'no_show', 'confirmed', 'no_show', new Date(s.startsAt.getTime() + 30 * 60_000)])
      }
      if (batch.length >= BATCH) { await insertMany(db, 'bookings', bookingCols, batch); batch = [] }
    }
  }
  if (batch.length) await insertMany(db, 'bookings', bookingCols, batch)
  counts.push({ table: 'bookings', rows: booked })
  counts.push({ table: 'check_ins', rows: await insertMany(db, 'check_ins', ['booking_id', 'host_id', 'outcome', 'seated', 'ids_seen', 'reason', 'recorded_at'], checkIns) })
  counts.push({ table: 'booking_events', rows: await insertMany(db, 'booking_events', ['booking_id', 'event', 'from_state', 'to_state', 'at'], events) })

  // The outbox: five years of confirmations and reminders, nearly all sent; a few pending or failed.
  const body = 'Your seats are booked. Bring an ID for everyone in the party; the host checks it at the door. '.repeat(4)
  const outboxRows = Array.from({ length: BUSY.outbox }, (_, i) => {
    const created = new Date(at(firstDay).getTime() + Math.floor(i * ((now.getTime() - at(firstDay).getTime()) / BUSY.outbox)))
    const x = r.next()
    const status = i > BUSY.outbox - 50 && x < 0.5 ? 'pending' : x < 0.003 ? 'failed' : 'sent'
    return [`busy-guest-${i % BUSY.guests}@example.test`, `Your booking ${referenceOf(i)}`, body, null, status, status === 'sent' ? 1 : status === 'failed' ? 8 : 0, status === 'failed' ? 'connect ECONNREFUSED' : null, created, status === 'sent' ? new Date(created.getTime() + 2000) : null, created]
  })
  counts.push({ table: 'outbox', rows: await insertMany(db, 'outbox', ['to_address', 'subject', 'text_body', 'html_body', 'status', 'attempts', 'last_error', 'next_attempt_at', 'sent_at', 'created_at'], outboxRows) })
  await db.query('ANALYZE TABLE users, products, product_measurements, flights, flight_pours, tasting_sessions, bookings, check_ins, booking_events, outbox')
  return { counts, seconds: (performance.now() - started) / 1000 }
}
