import { randomUUID } from 'node:crypto';
import type { NextFunction, Request, Response } from 'express';
import type { AppConfig } from '../config/app-config.js';

const SAFE_ID = /^[A-Za-z0-9._-]{1,64}$/;

/**
 * Gives every request a correlation id (client's `x-request-id` when well-formed) and writes one
 * structured JSON log line per request. Query strings and bodies are never logged (tokens, passwords).
 */
export function requestContext(config: Pick<AppConfig, 'logLevel'>) {
  const quiet = config.logLevel === 'silent' || config.logLevel === 'error' || config.logLevel === 'warn';
  return (req: Request, res: Response, next: NextFunction): void => {
    const incoming = req.header('x-request-id');
    const id = incoming && SAFE_ID.test(incoming) ? incoming : randomUUID();
    (req as Request & { id: string }).id = id;
    res.setHeader('x-request-id', id);
    const started = process.hrtime.bigint();
    res.on('finish', () => {
      if (quiet && res.statusCode < 500) return;
      const ms = Number(process.hrtime.bigint() - started) / 1e6;
      const user = (req as Request & { user?: { id: number } }).user;
      // Through console (standard output), so a test runner can attribute the line to its test.
      console.log(
        JSON.stringify({
          t: new Date().toISOString(),
          level: res.statusCode >= 500 ? 'error' : 'info',
          msg: 'request',
          requestId: id,
          method: req.method,
          path: req.path,
          status: res.statusCode,
          ms: Math.round(ms * 10) / 10,
          userId: user?.id,
        }),
      );
    });
    next();
  };
}
