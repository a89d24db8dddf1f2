import type Stripe from 'stripe'
import { Decimal } from 'decimal.js'
import type { Env } from '../../env'

let cached: { key: string; client: Stripe } | null = null

/**
 * The payment provider's official SDK. With STRIPE_API_URL set (the local fake that `npm start` and
 * `npm test` run on loopback) every call goes there; without it, to the provider itself.
 * The SDK is loaded on the first payment call, not at start: it is large (a few MB of code in memory) and
 * most requests never pay.
 */
export async function stripeClient(env: Env): Promise<Stripe> {
  const key = `${env.STRIPE_SECRET_KEY}|${env.STRIPE_API_URL ?? ''}`
  if (cached?.key === key) return cached.client
  const options: Stripe.StripeConfig = { maxNetworkRetries: 0, telemetry: false }
  if (env.STRIPE_API_URL) {
    const u = new URL(env.STRIPE_API_URL)
    options.host = u.hostname
    options.port = Number(u.port || (u.protocol === 'https:' ? 443 : 80))
    options.protocol = u.protocol === 'https:' ? 'https' : 'http'
    options.maxNetworkRetries = 0
  } else {
    options.maxNetworkRetries = 2
  }
  const { default: StripeSdk } = await import('stripe')
  if (cached?.key === key) return cached.client
  const client = new StripeSdk(env.STRIPE_SECRET_KEY, options)
  cached = { key, client }
  return client
}

/** Currencies a fee may be set in; all have two decimals (minor unit = 1/100). */
export const FEE_CURRENCIES = [
  'EUR',
  'GBP',
  'USD',
  'CHF',
  'NOK',
  'SEK',
  'DKK',
  'PLN',
  'CZK',
  'CAD',
  'AUD',
  'NZD',
] as const
export type FeeCurrency = (typeof FEE_CURRENCIES)[number]

/** "45.50" EUR → 4550 (minor units, exact). */
export function toMinorUnits(amount: string): number {
  const d = new Decimal(amount)
  const minor = d.times(100)
  if (!minor.isInteger()) throw new Error(`${amount} has more than two decimals`)
  return minor.toNumber()
}
