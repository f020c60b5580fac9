import { createParamDecorator, type ExecutionContext } from '@nestjs/common';
import type { Request, Response } from 'express';

/**
 * An AbortSignal that fires when the client goes away before its answer is sent, so a heavy read it
 * started is stopped. (`close` on the response fires on every finish; only an unfinished one aborts.)
 */
export function clientSignal(req: Request, res: Response): AbortSignal {
  const ac = new AbortController();
  res.once('close', () => {
    if (!res.writableFinished) ac.abort(new Error('client disconnected'));
  });
  if (req.destroyed && !res.writableFinished) ac.abort(new Error('client disconnected'));
  return ac.signal;
}

export const ClientSignal = createParamDecorator((_: unknown, ctx: ExecutionContext): AbortSignal => {
  const http = ctx.switchToHttp();
  return clientSignal(http.getRequest<Request>(), http.getResponse<Response>());
});
