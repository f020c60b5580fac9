import { Injectable } from '@nestjs/common';
import { ThrottlerGuard, ThrottlerModule } from '@nestjs/throttler';
import { APP_CONFIG, type AppConfig } from '../config/app-config.js';

/** Same words whether or not the account exists, and no hint of which limit was hit. */
export const THROTTLED_MESSAGE = 'Too many attempts from this address; wait a minute and try again';

type Req = { ip?: string; body?: { email?: unknown } };
const ip = (req: Req) => req.ip ?? 'unknown';
const email = (req: Req) => (typeof req.body?.email === 'string' ? req.body.email.trim().toLowerCase() : '');

/**
 * Throttling for sign-in and password reset only (not registered as a global guard: the catalogue
 * and the load tests must not be throttled). Two windows: per IP+e-mail (the configured limit) and
 * per IP across addresses (5× that), so one address cannot spray guesses over many accounts.
 */
export const LoginThrottlerModule = ThrottlerModule.forRootAsync({
  inject: [APP_CONFIG],
  useFactory: (config: AppConfig) => ({
    errorMessage: THROTTLED_MESSAGE,
    throttlers: [
      {
        name: 'account',
        limit: config.loginThrottleLimit,
        ttl: config.loginThrottleTtlMs,
        getTracker: (req: Req) => `${ip(req)}|${email(req)}`,
      },
      {
        name: 'address',
        limit: config.loginThrottleLimit * 5,
        ttl: config.loginThrottleTtlMs,
        getTracker: (req: Req) => ip(req),
      },
    ],
  }),
});

/** Put on a route with `@UseGuards(LoginThrottleGuard)`; the module above must be imported. */
@Injectable()
export class LoginThrottleGuard extends ThrottlerGuard {}
