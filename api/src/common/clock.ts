import { Module } from '@nestjs/common';

/** The clock is injected so tests can move time (token expiry, rolling quotas). */
export abstract class Clock {
  abstract now(): number;
}

export class SystemClock extends Clock {
  now(): number {
    return Date.now();
  }
}

/** Imported by every module whose providers read the time. */
@Module({ providers: [{ provide: Clock, useClass: SystemClock }], exports: [Clock] })
export class ClockModule {}
