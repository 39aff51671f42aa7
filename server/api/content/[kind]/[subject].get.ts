/** A note or article as the editor shows it: draft, published text and state. */
export default defineEventHandler(async (event) => {
  const { venue, kind, subject } = await contentTarget(event)
  return docView(await findDoc(useDb(), venue.id, kind, subject), subject)
})
