/**
 * Keeps bookings moving when nobody calls: releases holds whose time ran out (even if the payment
 * provider never says so), retries refunds that failed, and queues the day-before reminders.
 */
export default defineNitroPlugin((nitro) => {
  const seconds = Math.max(1, Number(useRuntimeConfig().booking.sweepSeconds))
  let running = false
  const timer = setInterval(() => {
    if (running) return
    running = true
    // Until the database is ready the start-up plugin reports the problem; the sweep just waits.
    whenReady()
      .then(() => sweepBookings().catch(err => console.error('[bookings] sweep failed:', (err as Error).message)), () => {})
      .finally(() => { running = false })
  }, seconds * 1000)
  timer.unref()
  nitro.hooks.hook('close', () => clearInterval(timer))
})
