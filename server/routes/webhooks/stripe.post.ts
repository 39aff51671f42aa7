/**
 * Stripe's webhook. The signature is checked on the raw body exactly as received (a re-serialised
 * body would not match); unsigned or wrongly signed deliveries are a 400 and change nothing.
 */
export default defineEventHandler(async (event) => {
  const raw = await readRawBody(event, false)
  const stripeEvent = verifyStripeEvent(raw, getHeader(event, 'stripe-signature'))
  const result = await processStripeEvent(stripeEvent, raw!)
  return { received: true, ...result }
})
