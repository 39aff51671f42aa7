import { resolve } from 'node:path'
import { migrate } from 'drizzle-orm/mysql2/migrator'
import { count, eq } from 'drizzle-orm'
import { DEMO_LAB, DEMO_PASSWORD, DEMO_PRODUCTS, DEMO_USERS, DEMO_VENUE } from '../demo/data'

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
  cautions: DEMO_VENUE.cautions,
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
    else await db.insert(tables.venues).values(DEFAULT_VENUE)
  }
  await bootstrapManager()
  console.log(`[larmoir] database ready in ${Date.now() - started} ms`)
}

async function seedDemo(): Promise<void> {
  const passwordHash = await hashPassword(DEMO_PASSWORD)
  await useDb().transaction(async (tx) => {
    const [venue] = await tx.insert(tables.venues).values(DEMO_VENUE).$returningId()
    if (!venue) throw new Error('demo venue insert failed')
    await tx.insert(tables.users).values(DEMO_USERS.map(u => ({ ...u, passwordHash })))
    for (const p of DEMO_PRODUCTS) {
      const { abvPctVol, residualSugarGL, ...product } = p
      const [row] = await tx.insert(tables.products).values({ ...product, venueId: venue.id }).$returningId()
      if (!row) throw new Error('demo product insert failed')
      await tx.insert(tables.productMeasurements).values({ productId: row.id, abvPctVol, residualSugarGL, ...DEMO_LAB, measuredOn: '2026-09-15' })
    }
  })
  console.log(`[larmoir] demo data loaded: ${DEMO_USERS.length} people, ${DEMO_PRODUCTS.length} products`)
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
