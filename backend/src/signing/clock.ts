import { Inject, Injectable } from '@nestjs/common';
import { APP_CONFIG, type AppConfig } from '../config/config';

/**
 * "Now" for signing: the date a contract carries and whether its cancellation window is open depend on
 * it. TEST_NOW (honoured only when NODE_ENV=test) fixes it, so a test can sign on a date it chooses; a
 * test may also replace now() on the app's instance to move the clock on.
 */
@Injectable()
export class Clock {
  constructor(@Inject(APP_CONFIG) private readonly config: AppConfig) {}

  now(): Date {
    return this.config.testNow ? new Date(this.config.testNow.getTime()) : new Date();
  }
}
