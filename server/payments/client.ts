// The payments client: the `stripe` SDK with the shop's secret key, or, with none set, the same SDK
// pointed at the local payments fake (server/payments/fake-api.ts) with a test key.
import Stripe from 'stripe';
import type { Env } from '../config/env';

/** `checkoutOrigin`: where checkout pages live, which proof pages must be allowed to send the buyer to. */
export type Payments = { sdk: Stripe; webhookSecret: string; fake: boolean; checkoutOrigin: string };

const FAKE_SECRET_KEY = 'sk_test_sheetsmith_local_fake';

export function createPayments(env: Pick<Env, 'STRIPE_SECRET_KEY' | 'STRIPE_WEBHOOK_SECRET' | 'PAYMENTS_FAKE_URL'>): Payments {
  if (env.STRIPE_SECRET_KEY)
    return {
      sdk: new Stripe(env.STRIPE_SECRET_KEY),
      webhookSecret: env.STRIPE_WEBHOOK_SECRET,
      fake: false,
      checkoutOrigin: 'https://checkout.stripe.com',
    };
  const url = new URL(env.PAYMENTS_FAKE_URL);
  const sdk = new Stripe(FAKE_SECRET_KEY, {
    host: url.hostname,
    port: url.port || (url.protocol === 'https:' ? 443 : 80),
    protocol: url.protocol === 'https:' ? 'https' : 'http',
    maxNetworkRetries: 1,
    timeout: 10_000,
    telemetry: false,
  });
  return { sdk, webhookSecret: env.STRIPE_WEBHOOK_SECRET, fake: true, checkoutOrigin: url.origin };
}
