/** Starts the database preparation at boot and retries pending e-mail on an interval. */
export default defineNitroPlugin((nitro) => {
  whenReady().then(kickOutbox).catch(err => console.error('[larmoir] start-up failed, will retry on the next request:', (err as Error).message))
  const seconds = Number(useRuntimeConfig().outboxIntervalSeconds)
  const timer = setInterval(() => { whenReady().then(kickOutbox).catch(() => {}) }, Math.max(1, seconds) * 1000)
  timer.unref()
  nitro.hooks.hook('close', async () => {
    clearInterval(timer)
    await closeDb()
  })
})
