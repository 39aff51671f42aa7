/** Every saved version, newest first, with who saved it and when. */
export default defineEventHandler(async (event) => {
  const { venue, kind, subject } = await contentTarget(event)
  const doc = await findDoc(useDb(), venue.id, kind, subject)
  return doc ? revisionsOf(doc.id) : []
})
