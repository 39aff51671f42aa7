import { and, eq } from 'drizzle-orm'
import { z } from 'zod'
import { IMAGE_MAX_BYTES, IMAGE_ROLES } from '../../../shared/content'
import { fieldErrorsFromZod } from '../../../shared/utils/fieldErrors'

const fields = z.object({
  // Without a product, the image is the venue's own photo of the room (the home page leads with the newest).
  productId: z.coerce.number({ error: 'Choose a product.' }).int().positive({ error: 'Choose a product.' }).optional(),
  role: z.enum(IMAGE_ROLES, { error: 'Choose photo or label.' }),
  altText: z.string().trim().max(300, { error: 'Use at most 300 characters.' }).default(''),
}).refine(f => f.productId !== undefined || f.role === 'photo', { path: ['role'], error: 'A picture of the room is a photo, not a label.' })

/** Uploads a product photo or label image, or a photo of the room (multipart: file, productId or none, role, altText). */
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'manager', 'marketing')
  const length = Number(getRequestHeader(event, 'content-length') ?? 0)
  if (length > IMAGE_MAX_BYTES + 64 * 1024) {
    tooLarge(`Images may be at most ${IMAGE_MAX_BYTES / 1024 / 1024} MB.`, { file: `At most ${IMAGE_MAX_BYTES / 1024 / 1024} MB.` })
  }
  const parts = await readMultipartFormData(event).catch(() => null)
  if (!parts) invalidFields({ file: 'Attach an image.' }, 'Send the image as a multipart form.')
  const file = parts.find(p => p.name === 'file' && p.filename !== undefined)
  const text = Object.fromEntries(parts.filter(p => p.filename === undefined && p.name).map(p => [p.name!, p.data.toString('utf8')]))
  const parsed = fields.safeParse(text)
  const errors: Record<string, string> = parsed.success ? {} : fieldErrorsFromZod(parsed.error)
  if (!file?.data.length) errors.file = 'Attach an image.'
  if (Object.keys(errors).length || !parsed.success) invalidFields(errors)
  const venue = await getVenue()
  const { productId } = parsed.data
  if (productId !== undefined) {
    const [product] = await useDb().select({ id: tables.products.id }).from(tables.products).where(and(eq(tables.products.id, productId), eq(tables.products.venueId, venue.id)))
    if (!product) notFound('No such product.')
  }
  const id = await storeImage(file!.data, { venueId: venue.id, productId: productId ?? null, role: parsed.data.role, altText: parsed.data.altText, userId: user.id })
  const [row] = await useDb().select().from(tables.images).where(eq(tables.images.id, id))
  setResponseStatus(event, 201)
  return imageView(row!)
})
