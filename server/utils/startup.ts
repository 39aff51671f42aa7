import { resolve } from 'node:path'
import { migrate } from 'drizzle-orm/mysql2/migrator'
import { count, eq } from 'drizzle-orm'
import { DEFAULT_GLASSES, DEMO_FLIGHTS, DEMO_LAB, DEMO_PASSWORD, DEMO_PRODUCTS, DEMO_USERS, DEMO_VENUE } from '../demo/data'
import { planDemoSessions } from '../demo/schedule'

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
  const pictures = await renderDemoPictures()
  const written: string[] = []
  let season = null as { sessions: number, observations: number } | null
  let seasonMs = 0
  await useDb().transaction(async (tx) => {
    const [venue] = await tx.insert(tables.venues).values(DEMO_VENUE).$returningId()
    const venueId = venue!.id
    await tx.insert(tables.users).values(DEMO_USERS.map(u => ({ ...u, passwordHash, emailVerifiedAt: new Date() })))
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
    const [marketer] = await tx.select().from(tables.users).where(eq(tables.users.role, 'marketing')).limit(1)
    const flightIds = new Map<string, number>()
    for (const f of DEMO_FLIGHTS) {
      const [row] = await tx.insert(tables.flights).values({ venueId, name: f.name, summary: f.summary, status: f.publish ? 'published' : 'draft', publishedAt: f.publish ? new Date() : null }).$returningId()
      const flightId = row!.id
      flightIds.set(f.name, flightId)
      await tx.update(tables.flights).set({ lineageId: flightId }).where(eq(tables.flights.id, flightId))
      await writePours(tx, flightId, f.pours.map(p => ({ productId: productIds.get(p.code)!, glassId: glassIds.get(p.glass)!, volumeMl: p.volumeMl, servingTempC: p.servingTempC })))
      if (!f.publish) continue
      // Weekly series off the public holidays, and one session later today so the host's day has
      // parties to check in from the first start (server/demo/schedule.ts).
      const plan = planDemoSessions(new Date(), DEMO_VENUE.timeZone)
      for (const s of plan.filter(p => p.holiday)) console.log(`[larmoir] demo: the session later today falls on ${s.holiday!.name}, kept as a holiday opening`)
      const seriesIds = new Map<number, string>()
      await tx.insert(tables.tastingSessions).values(plan.map((s) => {
        if (s.series !== null && !seriesIds.has(s.series)) seriesIds.set(s.series, crypto.randomUUID())
        return {
          venueId, flightId, startsAt: s.startsAt, seriesId: s.series === null ? null : seriesIds.get(s.series)!, hostId: host?.id ?? null, currency: DEMO_VENUE.currency,
          durationMinutes: s.durationMinutes, seats: s.seats, priceMinor: s.priceMinor, bookingCutoffMinutes: s.bookingCutoffMinutes,
        }
      }))
    }
    await seedDemoContent(tx, venueId, { products: productIds, flights: flightIds, authorId: marketer?.id ?? null }, pictures, written)
    await seedDemoBookings(tx, venueId)
    // After the bookings, which take the first upcoming sessions: the season adds past ones.
    const seasonStarted = Date.now()
    const published = DEMO_FLIGHTS.find(f => f.publish)
    season = published
      ? await seedDemoSeason(tx, venueId, { flightId: flightIds.get(published.name)!, hostId: host?.id ?? null, currency: DEMO_VENUE.currency, timeZone: DEMO_VENUE.timeZone })
      : null
    seasonMs = Date.now() - seasonStarted
  }).catch(async (err) => {
    for (const name of written) await removeImageFiles(name)
    throw err
  })
  console.log(`[larmoir] demo data loaded: ${DEMO_USERS.length} people, ${DEMO_PRODUCTS.length} products with notes and photos, ${DEMO_FLIGHTS.length} flights`)
  if (season) console.log(`[larmoir] demo season: ${season.observations} invented observations at ${season.sessions} past sessions in ${seasonMs} ms`)
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
