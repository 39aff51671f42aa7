/** No request is served before the migrations have run; a database that is down answers 503. */
export default defineEventHandler(async () => {
  try {
    await whenReady()
  }
  catch {
    throw createError({ status: 503, statusText: 'Service unavailable', message: 'The database is not answering. Please try again in a moment.' })
  }
})
