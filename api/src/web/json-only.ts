import type { NextFunction, Request, Response } from 'express';

/** Routes that take a multipart upload instead of JSON. */
const MULTIPART_ROUTES: readonly RegExp[] = [/^\/api\/datasets\/?$/];

const isJson = (type: string) => /^application\/([\w.+-]+\+)?json$/i.test(type);

/**
 * 415 for a request body that is not JSON on a JSON route. Without this, express's JSON parser
 * skips a text/plain body and the route runs on an empty one: a confusing 400 at best. Requests
 * without a body (no Content-Length or 0, no Transfer-Encoding) pass whatever their type.
 */
export function jsonBodiesOnly() {
  return (req: Request, res: Response, next: NextFunction) => {
    if (!req.path.startsWith('/api/') || req.method === 'GET' || req.method === 'HEAD') return next();
    const length = req.headers['content-length'];
    const hasBody = req.headers['transfer-encoding'] !== undefined || (length !== undefined && length !== '0');
    if (!hasBody) return next();
    const type = (req.headers['content-type'] ?? '').split(';')[0]!.trim();
    if (isJson(type)) return next();
    if (type.toLowerCase() === 'multipart/form-data' && MULTIPART_ROUTES.some((r) => r.test(req.path))) return next();
    const message = `Send the body as JSON with Content-Type: application/json${type ? ` (got ${type.slice(0, 80)})` : ''}`;
    res.status(415).json({
      statusCode: 415,
      error: 'Unsupported Media Type',
      message,
      details: [{ path: 'content-type', message: 'must be application/json' }],
    });
  };
}
