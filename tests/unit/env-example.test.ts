import { readFileSync } from 'node:fs'
import { resolve } from 'node:path'
import { describe, expect, it } from 'vitest'

/**
 * .env.example must match the code: it names every runtime setting (nuxt.config.ts runtimeConfig,
 * which Nuxt overrides from NUXT_<KEY>) and no variable the code does not read.
 */
const root = resolve(import.meta.dirname, '../..')
const snake = (k: string) => k.replace(/([a-z0-9])([A-Z])/g, '$1_$2').toUpperCase()

function envNames(obj: Record<string, unknown>, prefix = 'NUXT'): string[] {
  return Object.entries(obj).flatMap(([k, v]) => (v && typeof v === 'object' && !Array.isArray(v)
    ? envNames(v as Record<string, unknown>, `${prefix}_${snake(k)}`)
    : [`${prefix}_${snake(k)}`]))
}

/** Variables read outside runtimeConfig: nuxt-auth-utils' password, the server's address, the bootstrap invitation. */
const READ_ELSEWHERE = ['NUXT_SESSION_PASSWORD', 'HOST', 'PORT', 'NUXT_BOOTSTRAP_MANAGER_EMAIL']

describe('.env.example', async () => {
  const g = globalThis as { defineNuxtConfig?: (c: unknown) => unknown }
  g.defineNuxtConfig ??= c => c
  // A path in a variable: the type checker need not follow the config into Nuxt's own globals.
  const configFile = resolve(root, 'nuxt.config.ts')
  const config = (await import(/* @vite-ignore */ configFile)).default as { runtimeConfig: Record<string, unknown> }
  const settings = envNames(config.runtimeConfig)
  const text = readFileSync(resolve(root, '.env.example'), 'utf8')
  const named = [...text.matchAll(/^#?\s*([A-Z][A-Z0-9_]+)=/gm)].map(m => m[1]!)

  it('names every runtime setting', () => {
    expect(settings.filter(s => !named.includes(s))).toEqual([])
  })
  it('names nothing the code does not read', () => {
    expect(named.filter(n => !settings.includes(n) && !READ_ELSEWHERE.includes(n))).toEqual([])
  })
  it('gives the defaults the code has where it sets them', () => {
    const value = (n: string) => new RegExp(`^${n}=(.*)$`, 'm').exec(text)?.[1]
    const booking = config.runtimeConfig.booking as { holdMinutes: number, sweepSeconds: number }
    expect(Number(value('NUXT_BOOKING_HOLD_MINUTES'))).toBe(booking.holdMinutes)
    expect(Number(value('NUXT_BOOKING_SWEEP_SECONDS'))).toBe(booking.sweepSeconds)
  })
})
