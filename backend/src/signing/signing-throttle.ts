import { Injectable } from '@nestjs/common';
import { ThrottlerGuard } from '@nestjs/throttler';

/**
 * The homeowner's public signing routes: at most this many requests per minute from one address to one
 * route (GET page, GET PDF, POST sign, POST cancel are counted apart). A person reading, re-opening the
 * PDF and signing makes a handful; the limit is there for scripts guessing links or regenerating PDFs.
 */
export const SIGNING_THROTTLE = { name: 'signing', limit: 30, ttl: 60_000 } as const;

/**
 * Counts by the client's address (req.ip; trust proxy 'loopback' makes it the real client's behind a
 * local proxy). Its own throttler, so it neither uses nor touches the sign-in limit of AuthModule.
 */
@Injectable()
export class SigningThrottlerGuard extends ThrottlerGuard {
  override async onModuleInit(): Promise<void> {
    await super.onModuleInit();
    this.throttlers = [{ ...SIGNING_THROTTLE }];
  }
}
