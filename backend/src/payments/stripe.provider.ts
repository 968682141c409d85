import type { Provider } from '@nestjs/common';
import Stripe from 'stripe';
import { APP_CONFIG, type AppConfig } from '../config/config';

/** The processor's SDK client, or null when no secret key is configured (payments switched off). */
export const STRIPE = Symbol('STRIPE');

/**
 * One SDK client for the app. With STRIPE_API_HOST set it talks to that host (the local fake in
 * development and tests: `new Stripe(key, { host, port, protocol })`, as the SDK documents); without it,
 * to the real service. The SDK retries network failures itself, with the same idempotency key.
 */
export const stripeProvider: Provider = {
  provide: STRIPE,
  inject: [APP_CONFIG],
  useFactory: (config: AppConfig): Stripe | null => {
    const s = config.stripe;
    if (!s.secretKey) return null;
    return new Stripe(s.secretKey, {
      ...(s.apiHost ? { host: s.apiHost } : {}),
      ...(s.apiPort ? { port: s.apiPort } : {}),
      ...(s.apiProtocol ? { protocol: s.apiProtocol } : {}),
      maxNetworkRetries: 2,
      timeout: 20_000,
      appInfo: { name: 'Loambook' },
    });
  },
};
