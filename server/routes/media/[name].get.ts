import { mkdir, readFile, writeFile } from 'node:fs/promises'
import { resolve } from 'node:path'
import sharp from 'sharp'
import { z } from 'zod'

const query = z.object({
  w: z.coerce.number().int().min(16).max(2400).optional(),
  q: z.coerce.number().int().min(30).max(95).default(80),
  f: z.enum(['webp', 'jpeg', 'png']).optional(),
})
const TYPES = { webp: 'image/webp', jpeg: 'image/jpeg', png: 'image/png', jpg: 'image/jpeg' } as const

/**
 * Serves an uploaded image, resized and re-encoded on request (the @nuxt/image provider builds
 * these URLs). Names are generated and never reused, so answers can be cached for good.
 */
export default defineEventHandler(async (event) => {
  const name = getRouterParam(event, 'name') ?? ''
  if (!STORED_NAME.test(name)) notFound('Not found')
  const q = await readQueryAs(event, query)
  const dir = uploadDir()
  const original = await readFile(resolve(dir, name)).catch(() => null)
  if (!original) notFound('Not found')
  const ext = name.split('.').pop() as 'jpg' | 'png' | 'webp'
  setResponseHeader(event, 'cache-control', 'public, max-age=31536000, immutable')
  setResponseHeader(event, 'x-content-type-options', 'nosniff')
  if (!q.w && !q.f) {
    setResponseHeader(event, 'content-type', TYPES[ext])
    return original
  }
  const format = q.f ?? (ext === 'jpg' ? 'jpeg' : ext)
  const cacheFile = resolve(dir, 'cache', `${name.replace(/\.\w+$/, '')}-${q.w ?? 0}-${q.q}.${format}`)
  let out: Buffer | null = await readFile(cacheFile).catch(() => null)
  if (!out) {
    out = await sharp(original).resize({ width: q.w, withoutEnlargement: true }).toFormat(format, { quality: q.q }).toBuffer()
    await mkdir(resolve(dir, 'cache'), { recursive: true })
    await writeFile(cacheFile, out)
  }
  setResponseHeader(event, 'content-type', TYPES[format])
  return out
})
