import { ArgumentsHost, Catch, HttpException, HttpStatus, Logger, type ExceptionFilter } from '@nestjs/common';
import type { Request, Response } from 'express';
import {
  ConflictError,
  DomainError,
  ForbiddenError,
  NotFoundError,
  QuotaError,
  TooLargeError,
  ValidationError,
  type ErrorDetail,
} from '@driftgrid/domain';
import { ReadAbortedError, ReadBudgetError, ReadBusyError, ReadLimitError } from '../reads/read-errors.js';

export interface ErrorBody {
  statusCode: number;
  error: string;
  message: string;
  details?: ErrorDetail[];
  requestId?: string;
}

const DOMAIN_STATUS: [new (...a: never[]) => DomainError, number][] = [
  [ValidationError, HttpStatus.BAD_REQUEST],
  [NotFoundError, HttpStatus.NOT_FOUND],
  [ConflictError, HttpStatus.CONFLICT],
  [QuotaError, HttpStatus.TOO_MANY_REQUESTS],
  [TooLargeError, HttpStatus.PAYLOAD_TOO_LARGE],
  [ForbiddenError, HttpStatus.FORBIDDEN],
  // Heavy reads (api/src/reads): over the time budget or the pool is full → 503; a user over their limit → 429.
  [ReadBudgetError, HttpStatus.SERVICE_UNAVAILABLE],
  [ReadBusyError, HttpStatus.SERVICE_UNAVAILABLE],
  [ReadAbortedError, HttpStatus.SERVICE_UNAVAILABLE],
  [ReadLimitError, HttpStatus.TOO_MANY_REQUESTS],
];

const REASON: Record<number, string> = {
  400: 'Bad Request',
  401: 'Unauthorized',
  403: 'Forbidden',
  404: 'Not Found',
  405: 'Method Not Allowed',
  409: 'Conflict',
  413: 'Payload Too Large',
  415: 'Unsupported Media Type',
  422: 'Unprocessable Entity',
  429: 'Too Many Requests',
  500: 'Internal Server Error',
  503: 'Service Unavailable',
};

/** Express body-parser errors carry `type` and `status`; map them without leaking their text. */
function bodyParserError(e: unknown): ErrorBody | null {
  const err = e as { type?: string; status?: number; limit?: number };
  if (!err || typeof err.type !== 'string' || typeof err.status !== 'number') return null;
  if (err.type === 'entity.parse.failed') {
    return {
      statusCode: 400,
      error: REASON[400],
      message: 'Malformed JSON in the request body',
      details: [{ path: 'body', message: 'not valid JSON' }],
    };
  }
  if (err.type === 'entity.too.large') {
    return { statusCode: 413, error: REASON[413], message: `Request body exceeds the limit of ${err.limit} bytes` };
  }
  if (err.status >= 400 && err.status < 500) {
    return {
      statusCode: err.status,
      error: REASON[err.status] ?? 'Bad Request',
      message: 'The request body could not be read',
    };
  }
  return null;
}

/** One place that turns every error into the SPEC §6 error shape; 500s carry no internals. */
@Catch()
export class HttpErrorFilter implements ExceptionFilter {
  private readonly logger = new Logger('HttpError');

  catch(exception: unknown, host: ArgumentsHost): void {
    const ctx = host.switchToHttp();
    const res = ctx.getResponse<Response>();
    const req = ctx.getRequest<Request>();
    const requestId = (req as Request & { id?: string }).id;
    const body = this.toBody(exception, requestId, req);
    if (res.headersSent) {
      res.end();
      return;
    }
    const retry = (exception as { retryAfterSeconds?: unknown } | null)?.retryAfterSeconds;
    if (exception instanceof DomainError && typeof retry === 'number' && retry > 0) res.setHeader('Retry-After', retry);
    res.status(body.statusCode).json(body);
  }

  toBody(exception: unknown, requestId: string | undefined, req?: Request): ErrorBody {
    if (exception instanceof DomainError) {
      const status = DOMAIN_STATUS.find(([cls]) => exception instanceof cls)?.[1] ?? 400;
      return {
        statusCode: status,
        error: REASON[status],
        message: exception.message,
        ...(exception.details ? { details: exception.details } : {}),
      };
    }
    if (exception instanceof HttpException) {
      // Nest wraps body-parser failures; report them in our own words, not the parser's.
      const cause = bodyParserError((exception as { cause?: unknown }).cause);
      if (cause) return cause;
      const status = exception.getStatus();
      const r = exception.getResponse();
      let message = exception.message;
      let details: ErrorDetail[] | undefined;
      if (typeof r === 'object' && r !== null) {
        const m = (r as { message?: unknown }).message;
        if (typeof m === 'string') message = m;
        else if (Array.isArray(m)) message = m.join('; ');
        const d = (r as { details?: unknown }).details;
        if (Array.isArray(d)) details = d as ErrorDetail[];
      }
      if (status >= 500) return this.internal(exception, requestId, req);
      return { statusCode: status, error: REASON[status] ?? 'Error', message, ...(details ? { details } : {}) };
    }
    const parsed = bodyParserError(exception);
    if (parsed) return parsed;
    return this.internal(exception, requestId, req);
  }

  private internal(exception: unknown, requestId: string | undefined, req?: Request): ErrorBody {
    const err = exception instanceof Error ? exception : new Error(String(exception));
    this.logger.error(
      JSON.stringify({ requestId, method: req?.method, path: req?.path, error: err.message, stack: err.stack }),
    );
    return {
      statusCode: 500,
      error: REASON[500],
      message: 'Internal error; quote the request id when reporting it',
      requestId,
    };
  }
}
