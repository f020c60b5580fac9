import { Inject, Injectable, type CallHandler, type ExecutionContext, type NestInterceptor } from '@nestjs/common';
import type { Request, Response } from 'express';
import multer from 'multer';
import type { Observable } from 'rxjs';
import { TooLargeError, ValidationError } from '@driftgrid/domain';
import { APP_CONFIG, type AppConfig } from '../config/app-config.js';

/** Room for the multipart envelope and the small text fields beside the file. */
const ENVELOPE_BYTES = 256 * 1024;

const mb = (bytes: number) => `${Math.round((bytes / 1024 / 1024) * 10) / 10} MB`;

/**
 * Reads the multipart upload (field `file`) into memory with multer, bounded by AppConfig
 * uploadMaxBytes. Nest's FileInterceptor takes its limits when the decorator is evaluated and
 * reports a bare "File too large"; this one reads the configured limit and names it in the 413.
 * A request whose Content-Length already exceeds the limit is refused before its body is read;
 * otherwise busboy stops buffering at the limit (multer drains and discards the rest).
 * The client's file name is kept as metadata only and never used as a path (memory storage).
 */
@Injectable()
export class CsvUploadInterceptor implements NestInterceptor {
  private readonly upload: ReturnType<ReturnType<typeof multer>['single']>;

  constructor(@Inject(APP_CONFIG) private readonly config: AppConfig) {
    this.upload = multer({
      storage: multer.memoryStorage(),
      // Browsers send the file name as raw UTF-8 (HTML multipart encoding); latin1, the default,
      // would turn "Température.csv" into mojibake and hide control or bidi characters from the checks.
      defParamCharset: 'utf8',
      limits: { fileSize: config.uploadMaxBytes, files: 1, fields: 8, fieldSize: 64 * 1024, parts: 10 },
    }).single('file');
  }

  async intercept(context: ExecutionContext, next: CallHandler): Promise<Observable<unknown>> {
    const http = context.switchToHttp();
    const req = http.getRequest<Request>();
    const res = http.getResponse<Response>();
    const declared = Number(req.headers['content-length']);
    if (Number.isFinite(declared) && declared > this.config.uploadMaxBytes + ENVELOPE_BYTES) {
      // Tell the client not to keep sending; the connection closes after the 413.
      res.setHeader('Connection', 'close');
      throw this.tooLarge();
    }
    await new Promise<void>((resolve, reject) => {
      this.upload(req, res, (err: unknown) => (err ? reject(this.translate(err)) : resolve()));
    });
    return next.handle();
  }

  private tooLarge(): TooLargeError {
    const limit = this.config.uploadMaxBytes;
    return new TooLargeError(`The file exceeds the upload limit of ${mb(limit)} (${limit} bytes, UPLOAD_MAX_BYTES)`, [
      { path: 'file', message: `at most ${limit} bytes` },
    ]);
  }

  private translate(err: unknown): Error {
    if (err instanceof multer.MulterError) {
      if (err.code === 'LIMIT_FILE_SIZE') return this.tooLarge();
      if (err.code === 'LIMIT_UNEXPECTED_FILE') {
        return new ValidationError(`Unexpected file field "${err.field}"; send the CSV in the field "file"`, [
          { path: err.field ?? 'file', message: 'only the field "file" may hold a file' },
        ]);
      }
      return new ValidationError(`The upload could not be read: ${err.message}`, [
        { path: err.field ?? 'file', message: err.message },
      ]);
    }
    const e = err as { message?: string };
    if (e?.message && /multipart|boundary|Unexpected end of form|Malformed part header/i.test(e.message)) {
      return new ValidationError('The request is not a well-formed multipart upload', [
        { path: 'file', message: 'send multipart/form-data with the CSV in the field "file"' },
      ]);
    }
    return err instanceof Error ? err : new Error(String(err));
  }
}
