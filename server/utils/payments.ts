import Stripe from 'stripe'

let client: Stripe | undefined

/**
 * The one Stripe client (official SDK). In production only the secret key is set and the SDK uses
 * its own defaults; in development and tests `stripe.apiHost/apiPort/apiProtocol` point it at the
 * local fake (scripts/fakes/stripe.ts). Every call that creates something passes an idempotency
 * key, so a retry after a lost answer never charges or refunds twice.
 */
export function useStripe(): Stripe {
  if (!client) {
    const { stripe } = useRuntimeConfig()
    if (!stripe.secretKey) {
      throw createError({ status: 503, statusText: 'Payments not set up', message: 'Online payment is not set up yet. Please contact the venue to book.' })
    }
    client = new Stripe(stripe.secretKey, {
      ...(stripe.apiHost
        ? { host: stripe.apiHost, port: stripe.apiPort || undefined, protocol: (stripe.apiProtocol || 'https') as 'http' | 'https' }
        : {}),
      // The SDK retries network failures itself and adds idempotency keys where it does.
      maxNetworkRetries: stripe.apiHost ? 0 : 2,
      timeout: 20_000,
      telemetry: false,
    })
  }
  return client
}

/** True when the SDK talks to the local fake rather than to Stripe. */
const usingLocalStripe = () => Boolean(useRuntimeConfig().stripe.apiHost)

/**
 * Stripe accepts a Checkout Session lifetime of 30 minutes to 24 hours
 * (https://docs.stripe.com/api/checkout/sessions/create#create_checkout_session-expires_at);
 * the local fake relaxes the lower bound to 60 s so tests can see expiry.
 */
export function checkoutMinLifetimeMs(): number {
  return usingLocalStripe() ? 60_000 : 30 * 60_000
}

/** Verifies a webhook delivery on its raw body; anything unsigned or wrongly signed is a 400. */
export function verifyStripeEvent(raw: Buffer | string | undefined, signature: string | undefined): Stripe.Event {
  const secret = useRuntimeConfig().stripe.webhookSecret
  if (!secret) throw createError({ status: 503, statusText: 'Payments not set up', message: 'The webhook secret is not configured.' })
  if (!raw || !signature) throw createError({ status: 400, statusText: 'Unsigned', message: 'Missing body or Stripe-Signature header.' })
  try {
    return useStripe().webhooks.constructEvent(raw, signature, secret)
  }
  catch {
    throw createError({ status: 400, statusText: 'Bad signature', message: 'The Stripe-Signature header does not match the body.' })
  }
}

/** Stripe says the thing no longer can be done (already expired, already refunded): not worth retrying. */
export function isFinalStripeError(err: unknown): boolean {
  return err instanceof Stripe.errors.StripeInvalidRequestError
}
