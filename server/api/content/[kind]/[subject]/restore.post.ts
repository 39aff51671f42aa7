import { and, eq } from 'drizzle-orm'
import { contentRestoreSchema } from '../../../../../shared/schemas/content'

/** Puts an earlier revision back as the draft (publish it to show it to guests). */
export default defineEventHandler(async (event) => {
  const { user, venue, kind, subject } = await contentTarget(event)
  const { revisionId } = await readBodyAs(event, contentRestoreSchema)
  const doc = await findDoc(useDb(), venue.id, kind, subject)
  const [rev] = doc ? await useDb().select().from(tables.contentRevisions).where(and(eq(tables.contentRevisions.id, revisionId), eq(tables.contentRevisions.docId, doc.id))) : []
  if (!rev) notFound('No such revision of this text.')
  await useDb().transaction(tx => writeDoc(tx, venue.id, kind, subject, user.id, { title: rev.title, draftBody: rev.body, action: 'restore' }))
  return docView(await findDoc(useDb(), venue.id, kind, subject), subject)
})
