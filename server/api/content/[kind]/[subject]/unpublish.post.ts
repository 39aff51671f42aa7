/** Takes the text off guest pages and cards; the draft stays for editing. */
export default defineEventHandler(async (event) => {
  const { user, venue, kind, subject } = await contentTarget(event)
  await useDb().transaction(tx => writeDoc(tx, venue.id, kind, subject, user.id, { unpublish: true, action: 'unpublish' }))
  return docView(await findDoc(useDb(), venue.id, kind, subject), subject)
})
