/** Ends every sign-in of the account, on every device, this one included. */
export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  await endAllSessions(user.id)
  await clearUserSession(event)
  return { ok: true }
})
