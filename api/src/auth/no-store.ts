import type { NextFunction, Request, Response } from 'express';

/** Routes whose answers carry or concern secrets: sessions, token secrets, reset and invitation links. */
export const SECRET_BEARING_PREFIXES = ['/api/auth', '/api/tokens'] as const;

/**
 * Cache-Control: no-store (RFC 9111 §5.2.2.5) on every answer under those prefixes, refusals
 * included: set before guards run, so a throttled or failed attempt is not cached either.
 */
export function noStoreOnSecrets() {
  return (req: Request, res: Response, next: NextFunction) => {
    const path = req.path;
    if (SECRET_BEARING_PREFIXES.some((p) => path === p || path.startsWith(p + '/'))) {
      res.setHeader('Cache-Control', 'no-store');
    }
    next();
  };
}
