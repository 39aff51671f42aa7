/** Publishes the current draft: from now on guests, public pages and cards show it. */
export default defineEventHandler(async (event) => {
  const { user, venue, kind, subject } = await contentTarget(event)
  const existing = await findDoc(useDb(), venue.id, kind, subject)
  const draft = existing?.draftBody ?? subject.default?.body ?? ''
  if (!draft.trim()) conflict('Write something before publishing.')
  await useDb().transaction(tx => writeDoc(tx, venue.id, kind, subject, user.id, { publish: true, action: 'publish' }))
  return docView(await findDoc(useDb(), venue.id, kind, subject), subject)
})
