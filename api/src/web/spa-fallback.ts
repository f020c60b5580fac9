import fs from 'node:fs';
import path from 'node:path';
import express, { type Express, type NextFunction, type Request, type Response } from 'express';

/**
 * Serves the built ui and falls back to index.html for client-side routes. /api stays with Nest.
 * Hashed assets are cached for a year; index.html never, so a new build is picked up at once.
 */
export function mountUi(app: Express, uiDist: string): boolean {
  const index = path.join(uiDist, 'index.html');
  if (!fs.existsSync(index)) return false;
  app.use(
    express.static(uiDist, {
      index: false,
      setHeaders(res, file) {
        res.setHeader(
          'Cache-Control',
          file.includes(`${path.sep}assets${path.sep}`) ? 'public, max-age=31536000, immutable' : 'no-cache',
        );
      },
    }),
  );
  app.use((req: Request, res: Response, next: NextFunction) => {
    if ((req.method !== 'GET' && req.method !== 'HEAD') || req.path === '/api' || req.path.startsWith('/api/'))
      return next();
    res.setHeader('Cache-Control', 'no-cache');
    res.sendFile(index);
  });
  return true;
}
