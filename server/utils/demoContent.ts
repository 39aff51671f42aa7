import { randomUUID } from 'node:crypto'
import { mkdir, writeFile } from 'node:fs/promises'
import { resolve } from 'node:path'
import sharp from 'sharp'
import { DEMO_INTROS, DEMO_NOTES, DEMO_PHOTO_ALT } from '../demo/content'
import { DRAWN_PRODUCTS, productPicture, roomPicture } from '../demo/pictures'

/** A demo photo rendered from its drawing: the room (no product) or a product's, by code. */
interface DemoPicture { product: string | null, altText: string, data: Buffer, width: number, height: number }

/** JPEG quality of the demo's photos: the same as an upload re-encoded by storeImage (85). */
const DEMO_JPEG_QUALITY = 85

/** Renders the demo's drawings (server/demo/pictures.ts) to JPEG, before the seeding transaction. */
export async function renderDemoPictures(): Promise<DemoPicture[]> {
  const drawings = [{ product: null, svg: roomPicture(), altText: DEMO_PHOTO_ALT.room }, ...DRAWN_PRODUCTS.map(code => ({ product: code, svg: productPicture(code), altText: DEMO_PHOTO_ALT.products[code] ?? '' }))]
  return Promise.all(drawings.map(async (d) => {
    const { data, info } = await sharp(Buffer.from(d.svg)).jpeg({ quality: DEMO_JPEG_QUALITY, mozjpeg: true }).toBuffer({ resolveWithObject: true })
    return { product: d.product, altText: d.altText, data, width: info.width, height: info.height }
  }))
}

/**
 * Inside the seeding transaction: every demo product's tasting note and every flight's
 * introduction, published by the demo's marketer (each with its revision), and the photos stored
 * as uploads are (the room's has no product: it is the venue's own). Returns the files written, so
 * a rolled-back seed can remove them.
 */
export async function seedDemoContent(tx: Tx, venueId: number, ids: { products: Map<string, number>, flights: Map<string, number>, authorId: number | null }, pictures: DemoPicture[], written: string[]): Promise<void> {
  const now = new Date()
  const docs = [
    ...Object.entries(DEMO_NOTES).map(([code, body]) => ({ kind: 'product_note' as const, subjectId: ids.products.get(code), body })),
    ...Object.entries(DEMO_INTROS).map(([name, body]) => ({ kind: 'flight_intro' as const, subjectId: ids.flights.get(name), body })),
  ]
  for (const d of docs) {
    if (d.subjectId === undefined) throw new Error(`demo content for a missing ${d.kind}`)
    const [row] = await tx.insert(tables.contentDocs).values({
      venueId, kind: d.kind, subjectId: d.subjectId, title: '', draftBody: d.body, publishedBody: d.body, publishedTitle: '',
      status: 'published', publishedAt: now, updatedById: ids.authorId,
    }).$returningId()
    await tx.insert(tables.contentRevisions).values({ docId: row!.id, action: 'publish', title: '', body: d.body, authorId: ids.authorId })
  }
  const dir = uploadDir()
  await mkdir(dir, { recursive: true })
  for (const p of pictures) {
    const storedName = `${randomUUID()}.jpg`
    await writeFile(resolve(dir, storedName), p.data)
    written.push(storedName)
    await tx.insert(tables.images).values({
      venueId, productId: p.product === null ? null : ids.products.get(p.product)!, role: 'photo', storedName, mimeType: 'image/jpeg',
      bytes: p.data.length, width: p.width, height: p.height, altText: p.altText, uploadedById: ids.authorId,
    })
  }
}
