/** Signs out this device: its cookie, and any copy of it, stops working; other devices stay signed in. */
export default defineEventHandler(async (event) => {
  await endThisSession(event)
  return { ok: true }
})
