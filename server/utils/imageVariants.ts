import { mkdir, readdir, readFile, rm, stat, writeFile } from 'node:fs/promises'
import { resolve } from 'node:path'
import type { H3Event } from 'h3'
import sharp from 'sharp'
import { IMAGE_VARIANT_QUALITY, type ImageVariantFormat } from '../../shared/content'

/**
 * Resized copies of uploaded images, made on request by /media and kept on disk in the upload
 * folder's cache/. Everything here bounds what a stranger can make the server do:
 * - only the widths and formats of shared/content.ts, one quality per format (so at most
 *   IMAGE_WIDTHS × formats copies of an image exist);
 * - the cache keeps at most `images.cacheMaxFiles` files and `images.cacheMaxMegabytes` MB, dropping
 *   the least recently served first;
 * - at most `images.resizesAtOnce` resizes run at a time, the rest wait their turn;
 * - each client may cause at most `images.missesPerMinute` resizes a minute (429 after).
 * The cache's index and the counters live in this process; with several processes each keeps its own
 * bound over the same folder (documented in docs/security.md).
 */
interface Settings { cacheMaxFiles: number, cacheMaxMegabytes: number, resizesAtOnce: number, missesPerMinute: number }
const settings = (): Settings => {
  const s = useRuntimeConfig().images
  return { cacheMaxFiles: Number(s.cacheMaxFiles), cacheMaxMegabytes: Number(s.cacheMaxMegabytes), resizesAtOnce: Math.max(1, Number(s.resizesAtOnce)), missesPerMinute: Number(s.missesPerMinute) }
}

const cacheDir = () => resolve(uploadDir(), 'cache')

/** File name → bytes, least recently served first (a Map keeps insertion order; a hit re-inserts). */
let index: Map<string, number> | null = null
let indexBytes = 0
let loading: Promise<Map<string, number>> | null = null

async function loadIndex(): Promise<Map<string, number>> {
  if (index) return index
  loading ??= (async () => {
    const dir = cacheDir()
    const names = await readdir(dir).catch(() => [] as string[])
    const found = await Promise.all(names.map(async n => ({ n, s: await stat(resolve(dir, n)).catch(() => null) })))
    const fresh = new Map<string, number>()
    indexBytes = 0
    for (const { n, s } of found.filter(f => f.s?.isFile()).sort((a, b) => a.s!.mtimeMs - b.s!.mtimeMs)) {
      fresh.set(n, s!.size)
      indexBytes += s!.size
    }
    index = fresh
    return fresh
  })()
  return loading
}

function forget(map: Map<string, number>, name: string): void {
  const bytes = map.get(name)
  if (bytes === undefined) return
  map.delete(name)
  indexBytes -= bytes
}

/** Adds a file to the index and drops the least recently served ones past the bound. */
async function remember(map: Map<string, number>, name: string, bytes: number): Promise<void> {
  forget(map, name)
  map.set(name, bytes)
  indexBytes += bytes
  const { cacheMaxFiles, cacheMaxMegabytes } = settings()
  const victims: string[] = []
  for (const old of map.keys()) {
    if (map.size - victims.length <= cacheMaxFiles && indexBytes <= cacheMaxMegabytes * 1024 * 1024) break
    if (old === name) continue
    victims.push(old)
    indexBytes -= map.get(old)!
  }
  for (const v of victims) map.delete(v)
  await Promise.all(victims.map(v => rm(resolve(cacheDir(), v), { force: true })))
}

/** Drops the index entries of an image's copies (their files are removed by removeImageFiles). */
export function forgetVariantsOf(stem: string): void {
  if (!index) return
  for (const name of [...index.keys()]) if (name.startsWith(`${stem}-`)) forget(index, name)
}

let running = 0
const waiting: Array<() => void> = []

/** Runs `work` when fewer than `images.resizesAtOnce` resizes are running (first come, first served). */
async function oneOfFew<T>(work: () => Promise<T>): Promise<T> {
  if (running >= settings().resizesAtOnce) await new Promise<void>(go => waiting.push(go))
  else running++
  try {
    return await work()
  }
  finally {
    const next = waiting.shift()
    if (next) next()
    else running--
  }
}

/** Client address → the times of its recent resizes (the last minute). */
const misses = new Map<string, number[]>()
const MINUTE_MS = 60_000

function countMiss(event: H3Event): void {
  const now = Date.now()
  if (misses.size > 10_000) for (const [k, times] of misses) if (times.at(-1)! < now - MINUTE_MS) misses.delete(k)
  const who = clientAddress(event)
  const times = (misses.get(who) ?? []).filter(t => t > now - MINUTE_MS)
  if (times.length >= settings().missesPerMinute) {
    const seconds = Math.max(1, Math.ceil((times[0]! + MINUTE_MS - now) / 1000))
    setResponseHeader(event, 'retry-after', seconds)
    throw createError({ status: 429, statusText: 'Too many image sizes', message: `Too many new image sizes asked for from your network; try again in ${seconds} s.`, data: { retryAfterSeconds: seconds } })
  }
  times.push(now)
  misses.set(who, times)
}

/**
 * The copy of an uploaded image (`original`, stored as `name`) at an allowed width and format: from
 * the cache, else made now (counted against the client, one of few at a time) and cached.
 */
export async function imageVariant(event: H3Event, name: string, original: Buffer, width: number, format: ImageVariantFormat): Promise<Buffer> {
  const map = await loadIndex()
  const file = `${name.replace(/\.\w+$/, '')}-${width}.${format}`
  const path = resolve(cacheDir(), file)
  if (map.has(file)) {
    const hit = await readFile(path).catch(() => null)
    if (hit) {
      const bytes = map.get(file)!
      map.delete(file)
      map.set(file, bytes)
      return hit
    }
    forget(map, file)
  }
  countMiss(event)
  return oneOfFew(async () => {
    const out = await sharp(original).resize({ width, withoutEnlargement: true }).toFormat(format, { quality: IMAGE_VARIANT_QUALITY[format] }).toBuffer()
    await mkdir(cacheDir(), { recursive: true })
    await writeFile(path, out)
    await remember(map, file, out.length)
    return out
  })
}
