import { readFile } from 'node:fs/promises'
import { resolve } from 'node:path'
import { z } from 'zod'
import { snapImageWidth } from '../../../shared/content'

const query = z.object({
  w: z.coerce.number().int().min(16).max(2400).optional(),
  // Read for older addresses and ignored: each format has one quality (IMAGE_VARIANT_QUALITY).
  q: z.coerce.number().int().min(30).max(95).optional(),
  f: z.enum(['webp', 'jpeg']).optional(),
})
const TYPES = { webp: 'image/webp', jpeg: 'image/jpeg', png: 'image/png', jpg: 'image/jpeg' } as const

/**
 * Serves an uploaded image as stored, or a copy at one of the allowed widths (any other width is
 * snapped up to the next allowed one) in WebP or JPEG; see server/utils/imageVariants.ts. Names are
 * generated and never reused, so answers can be cached for good.
 */
export default defineEventHandler(async (event) => {
  const name = getRouterParam(event, 'name') ?? ''
  if (!STORED_NAME.test(name)) notFound('Not found')
  const q = await readQueryAs(event, query)
  const original = await readFile(resolve(uploadDir(), name)).catch(() => null)
  if (!original) notFound('Not found')
  const ext = name.split('.').pop() as 'jpg' | 'png' | 'webp'
  setResponseHeader(event, 'x-content-type-options', 'nosniff')
  if (!q.w && !q.f) {
    setResponseHeader(event, 'cache-control', 'public, max-age=31536000, immutable')
    setResponseHeader(event, 'content-type', TYPES[ext])
    return original
  }
  const format = q.f ?? (ext === 'jpg' ? 'jpeg' : 'webp')
  const out = await imageVariant(event, name, original, snapImageWidth(q.w ?? 2400), format)
  setResponseHeader(event, 'cache-control', 'public, max-age=31536000, immutable')
  setResponseHeader(event, 'content-type', TYPES[format])
  return out
})
