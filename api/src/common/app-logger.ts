import { ConsoleLogger, type LogLevel } from '@nestjs/common';
import type { AppConfig } from '../config/app-config.js';

const LEVELS: Record<AppConfig['logLevel'], LogLevel[]> = {
  debug: ['debug', 'log', 'warn', 'error', 'fatal'],
  info: ['log', 'warn', 'error', 'fatal'],
  warn: ['warn', 'error', 'fatal'],
  error: ['error', 'fatal'],
  silent: [],
};

// The framework's own start-up chatter: one line per module and per route (about a hundred in all).
// It says nothing an operator acts on, so it is shown only at LOG_LEVEL=debug.
const BOOT_CONTEXTS = new Set(['NestFactory', 'InstanceLoader', 'RoutesResolver', 'RouterExplorer', 'NestApplication']);

/**
 * Nest's console logger at the configured level, without the framework's boot lines below debug.
 * Under test it writes through `console`, so the test runner can keep the output of passing tests
 * (deliberate faults included) out of the report and show it only beside a failure.
 */
export class AppLogger extends ConsoleLogger {
  constructor(
    private readonly level: AppConfig['logLevel'],
    underTest: boolean,
  ) {
    super({ logLevels: LEVELS[level], forceConsole: underTest });
  }

  override log(message: unknown, ...rest: unknown[]): void {
    const context = rest.at(-1);
    if (this.level !== 'debug' && typeof context === 'string' && BOOT_CONTEXTS.has(context)) return;
    super.log(message, ...rest);
  }
}
