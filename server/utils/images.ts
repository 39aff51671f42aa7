import { randomUUID } from 'node:crypto'
import { mkdir, rm, writeFile, readdir } from 'node:fs/promises'
import { resolve } from 'node:path'
import { fileTypeFromBuffer } from 'file-type'
import sharp from 'sharp'
import { and, asc, eq, inArray } from 'drizzle-orm'
import { IMAGE_MAX_BYTES, IMAGE_MAX_PIXELS, IMAGE_TYPES, type ImageRole } from '../../shared/content'
import type { ImageView } from '../../shared/types/content'

/** Longest side kept after upload, px: plenty for a phone screen or a printed card. */
const MAX_SIDE_PX = 2400
const EXT: Record<(typeof IMAGE_TYPES)[number], string> = { 'image/jpeg': 'jpg', 'image/png': 'png', 'image/webp': 'webp' }
export const STORED_NAME = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}\.(jpg|png|webp)$/

export function uploadDir(): string {
  return resolve(process.cwd(), useRuntimeConfig().uploadDir)
}

/**
 * Checks an upload by its bytes (not its name or declared type), refuses anything but JPEG, PNG
 * or WebP and anything over the size limit, re-encodes it with sharp (which drops EXIF, GPS and
 * other metadata and applies the orientation), and stores it under a generated name.
 */
export async function storeImage(data: Buffer, meta: { venueId: number, productId: number | null, role: ImageRole, altText: string, userId: number }) {
  if (data.length > IMAGE_MAX_BYTES) {
    tooLarge(`Images may be at most ${IMAGE_MAX_BYTES / 1024 / 1024} MB.`, { file: `At most ${IMAGE_MAX_BYTES / 1024 / 1024} MB.` })
  }
  const type = await fileTypeFromBuffer(data)
  const mime = type?.mime as (typeof IMAGE_TYPES)[number] | undefined
  if (!mime || !IMAGE_TYPES.includes(mime)) {
    throw createError({ status: 415, statusText: 'Not an image we take', message: 'Upload a JPEG, PNG or WebP image. The file\'s contents were checked, not its name.', data: { fields: { file: 'Only JPEG, PNG or WebP.' } } })
  }
  // The header is read before any pixel is decoded, so an image too large to decode costs nothing.
  const size = await sharp(data).metadata().catch(() => null)
  if (size?.width && size.height && size.width * size.height > IMAGE_MAX_PIXELS) {
    const mp = (size.width * size.height / 1e6).toFixed(1)
    tooLarge(`This image is ${size.width} × ${size.height} (${mp} megapixels); at most ${IMAGE_MAX_PIXELS / 1e6} megapixels. Export it smaller and upload again.`, { file: `At most ${IMAGE_MAX_PIXELS / 1e6} megapixels.` })
  }
  let pipeline = sharp(data, { failOn: 'error', limitInputPixels: IMAGE_MAX_PIXELS }).rotate().resize({ width: MAX_SIDE_PX, height: MAX_SIDE_PX, fit: 'inside', withoutEnlargement: true })
  pipeline = mime === 'image/png' ? pipeline.png({ compressionLevel: 9 }) : mime === 'image/webp' ? pipeline.webp({ quality: 85 }) : pipeline.jpeg({ quality: 85, mozjpeg: true })
  let out: { data: Buffer, info: sharp.OutputInfo }
  try {
    out = await pipeline.toBuffer({ resolveWithObject: true })
  }
  catch {
    throw createError({ status: 415, statusText: 'Unreadable image', message: 'This image could not be read. Try exporting it again as JPEG or PNG.', data: { fields: { file: 'The image could not be read.' } } })
  }
  const storedName = `${randomUUID()}.${EXT[mime]}`
  const dir = uploadDir()
  await mkdir(dir, { recursive: true })
  const path = resolve(dir, storedName)
  await writeFile(path, out.data)
  try {
    const [row] = await useDb().insert(tables.images).values({
      venueId: meta.venueId, productId: meta.productId, role: meta.role, storedName, mimeType: mime,
      bytes: out.data.length, width: out.info.width, height: out.info.height, altText: meta.altText, uploadedById: meta.userId,
    }).$returningId()
    return row!.id
  }
  catch (err) {
    await rm(path, { force: true })
    throw err
  }
}

/** Removes a stored image and every resized copy made from it. */
export async function removeImageFiles(storedName: string): Promise<void> {
  if (!STORED_NAME.test(storedName)) return
  const dir = uploadDir()
  await rm(resolve(dir, storedName), { force: true })
  const cache = resolve(dir, 'cache')
  const stem = storedName.replace(/\.\w+$/, '')
  forgetVariantsOf(stem)
  for (const f of await readdir(cache).catch(() => [] as string[])) if (f.startsWith(`${stem}-`)) await rm(resolve(cache, f), { force: true })
}

export function imageView(row: typeof tables.images.$inferSelect): ImageView {
  return { id: row.id, productId: row.productId, role: row.role, src: row.storedName, mimeType: row.mimeType, bytes: row.bytes, width: row.width, height: row.height, altText: row.altText }
}

/** Each product's first photo (or label when it has no photo), for flight pages and cards. */
export async function productPhotos(venueId: number, productIds: number[]): Promise<Map<number, ImageView>> {
  if (!productIds.length) return new Map()
  const rows = await useDb().select().from(tables.images)
    .where(and(eq(tables.images.venueId, venueId), inArray(tables.images.productId, productIds)))
    .orderBy(asc(tables.images.id))
  const out = new Map<number, ImageView>()
  for (const r of rows.filter(r => r.role === 'photo').concat(rows.filter(r => r.role === 'label'))) {
    if (r.productId !== null && !out.has(r.productId)) out.set(r.productId, imageView(r))
  }
  return out
}
