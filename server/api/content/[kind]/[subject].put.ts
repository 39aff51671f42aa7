import { contentSaveSchema } from '../../../../shared/schemas/content'

/** Saves the draft (guests still see the published text) and keeps a revision. */
export default defineEventHandler(async (event) => {
  const { user, venue, kind, subject } = await contentTarget(event)
  const { title, body } = await readBodyAs(event, contentSaveSchema)
  await useDb().transaction(tx => writeDoc(tx, venue.id, kind, subject, user.id, { title, draftBody: body, action: 'save' }))
  return docView(await findDoc(useDb(), venue.id, kind, subject), subject)
})
