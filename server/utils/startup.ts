import { resolve } from 'node:path'
import { migrate } from 'drizzle-orm/mysql2/migrator'
import { count, eq } from 'drizzle-orm'
import { DateTime } from 'luxon'
import { DEFAULT_GLASSES, DEMO_FLIGHTS, DEMO_LAB, DEMO_PASSWORD, DEMO_PRODUCTS, DEMO_SESSION_SERIES, DEMO_USERS, DEMO_VENUE } from '../demo/data'

/** Default venue for a fresh production database; the manager edits it in the venue settings. */
const DEFAULT_VENUE = {
  name: 'My tasting room',
  address: 'Set the address in the venue settings',
  timeZone: 'UTC',
  currency: 'USD',
  legalAge: 21,
  standardDrinkKind: 'us' as const,
  standardDrinkGrams: 14,
  guestEthanolLimitGrams: 42,
  cancellationCutoffHours: 24,
  /** The fixed block of cautions is always printed (shared/cautions.ts); the venue adds its own lines. */
  cautions: '',
}

let ready: Promise<void> | undefined

/** Applies migrations, then loads the demo (empty database, demo on) or a default venue. Once per process. */
export function whenReady(): Promise<void> {
  ready ??= prepare().catch((err) => {
    ready = undefined // try again on the next request, e.g. when the database comes back
    throw err
  })
  return ready
}

async function prepare(): Promise<void> {
  const config = useRuntimeConfig()
  const db = useDb()
  const started = Date.now()
  await migrate(db, { migrationsFolder: resolve(process.cwd(), config.migrationsDir) })
  const [{ venues } = { venues: 0 }] = await db.select({ venues: count() }).from(tables.venues)
  if (venues === 0) {
    if (config.demoSeed) await seedDemo()
    else {
      const [venue] = await db.insert(tables.venues).values(DEFAULT_VENUE).$returningId()
      await db.insert(tables.glasses).values(DEFAULT_GLASSES.map(g => ({ ...g, venueId: venue!.id })))
    }
  }
  await bootstrapManager()
  console.log(`[larmoir] database ready in ${Date.now() - started} ms`)
}

async function seedDemo(): Promise<void> {
  const passwordHash = await hashPassword(DEMO_PASSWORD)
  await useDb().transaction(async (tx) => {
    const [venue] = await tx.insert(tables.venues).values(DEMO_VENUE).$returningId()
    const venueId = venue!.id
    await tx.insert(tables.users).values(DEMO_USERS.map(u => ({ ...u, passwordHash })))
    const productIds = new Map<string, number>()
    for (const p of DEMO_PRODUCTS) {
      const { abvPctVol, residualSugarGL, ...product } = p
      const [row] = await tx.insert(tables.products).values({ ...product, venueId }).$returningId()
      productIds.set(p.code, row!.id)
      await tx.insert(tables.productMeasurements).values({ productId: row!.id, abvPctVol, residualSugarGL, ...DEMO_LAB, measuredOn: '2026-09-15' })
    }
    await tx.insert(tables.glasses).values(DEFAULT_GLASSES.map(g => ({ ...g, venueId })))
    const glassIds = new Map((await tx.select().from(tables.glasses)).map(g => [g.name, g.id]))
    const [host] = await tx.select().from(tables.users).where(eq(tables.users.role, 'host')).limit(1)
    for (const f of DEMO_FLIGHTS) {
      const [row] = await tx.insert(tables.flights).values({ venueId, name: f.name, summary: f.summary, status: f.publish ? 'published' : 'draft', publishedAt: f.publish ? new Date() : null }).$returningId()
      const flightId = row!.id
      await tx.update(tables.flights).set({ lineageId: flightId }).where(eq(tables.flights.id, flightId))
      await writePours(tx, flightId, f.pours.map(p => ({ productId: productIds.get(p.code)!, glassId: glassIds.get(p.glass)!, volumeMl: p.volumeMl, servingTempC: p.servingTempC })))
      if (!f.publish) continue
      for (const series of DEMO_SESSION_SERIES) {
        const today = DateTime.now().setZone(DEMO_VENUE.timeZone)
        const first = today.plus({ days: ((series.weekday - today.weekday + 7) % 7) || 7 })
        const starts = weeklyStartsUtc({ startDate: first.toISODate()!, startTime: series.startTime, weeks: series.weeks, timeZone: DEMO_VENUE.timeZone })
        const seriesId = crypto.randomUUID()
        await tx.insert(tables.tastingSessions).values(starts.map(startsAt => ({
          venueId, flightId, startsAt, seriesId, hostId: host?.id ?? null, currency: DEMO_VENUE.currency,
          durationMinutes: series.durationMinutes, seats: series.seats, priceMinor: series.priceMinor, bookingCutoffMinutes: series.bookingCutoffMinutes,
        })))
      }
      // One session later today, so the host's day has parties to check in from the first start.
      const soon = DateTime.now().setZone(DEMO_VENUE.timeZone).plus({ minutes: 90 }).startOf('hour')
      await tx.insert(tables.tastingSessions).values({
        venueId, flightId, startsAt: soon.toUTC().toJSDate(), hostId: host?.id ?? null, currency: DEMO_VENUE.currency,
        durationMinutes: 75, seats: 10, priceMinor: 3500, bookingCutoffMinutes: 30,
      })
    }
    await seedDemoBookings(tx, venueId)
  })
  console.log(`[larmoir] demo data loaded: ${DEMO_USERS.length} people, ${DEMO_PRODUCTS.length} products, ${DEMO_FLIGHTS.length} flights`)
}

/**
 * A fresh production install has no manager. With NUXT_BOOTSTRAP_MANAGER_EMAIL set and no manager
 * yet, one invitation is issued and its link printed to the server log (and mailed).
 */
async function bootstrapManager(): Promise<void> {
  const email = process.env.NUXT_BOOTSTRAP_MANAGER_EMAIL?.trim().toLowerCase()
  if (!email) return
  const db = useDb()
  const [{ managers } = { managers: 0 }] = await db.select({ managers: count() }).from(tables.users).where(eq(tables.users.role, 'manager'))
  if (managers > 0) return
  const link = await db.transaction(async (tx) => {
    const [user] = await tx.insert(tables.users).values({ email, name: 'Manager', role: 'manager' }).$returningId()
    return queueInvitation(tx, { userId: user!.id, email, name: 'Manager', role: 'manager', invitedBy: { name: 'Larmoir set-up' } })
  })
  console.log(`[larmoir] first manager invited: ${link}`)
  kickOutbox()
}
