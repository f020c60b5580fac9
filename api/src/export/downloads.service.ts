import fs from 'node:fs';
import { pipeline } from 'node:stream/promises';
import type { Readable } from 'node:stream';
import { Inject, Injectable, Logger } from '@nestjs/common';
import type { Request, Response } from 'express';
import type { AuthUser } from '../auth/current-user.js';
import { Clock } from '../common/clock.js';
import { APP_CONFIG, type AppConfig } from '../config/app-config.js';
import { DatasetsService } from '../datasets/datasets.service.js';
import { SweepAccess } from '../sweeps/sweep-access.js';
import { attachment } from './csv-format.js';
import { DatasetExportBuilder } from './dataset-export.service.js';
import { archivePath } from './sweep-archive.service.js';
import { SweepExportBuilder } from './sweep-export.service.js';

/** Sends export zips: built on the fly for live sweeps and datasets, the stored file for archives. */
@Injectable()
export class Downloads {
  private readonly logger = new Logger('Downloads');

  constructor(
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    private readonly access: SweepAccess,
    private readonly datasets: DatasetsService,
    private readonly sweepZip: SweepExportBuilder,
    private readonly datasetZip: DatasetExportBuilder,
    private readonly clock: Clock,
  ) {}

  async sweep(user: AuthUser, id: number, req: Request, res: Response): Promise<void> {
    const s = this.access.readable(user, id);
    const fileName = this.sweepZip.fileName(s);
    if (s.status === 'archived' && s.archiveFile && s.archiveSha256) {
      const file = archivePath(this.config, s.archiveFile);
      // Fails loudly (500, logged) if the frozen file has gone: an archive is never silently rebuilt.
      const stat = await fs.promises.stat(file);
      const etag = `"${s.archiveSha256}"`;
      res.setHeader('ETag', etag);
      res.setHeader('X-Archive-SHA256', s.archiveSha256);
      res.setHeader('Cache-Control', 'private, max-age=0, must-revalidate');
      if (req.headers['if-none-match'] === etag) {
        res.status(304).end();
        return;
      }
      res.setHeader('Content-Type', 'application/zip');
      res.setHeader('Content-Length', String(stat.size));
      res.setHeader('Content-Disposition', attachment(fileName));
      await this.send(fs.createReadStream(file), res, `archive of sweep ${id}`);
      return;
    }
    const { zip } = this.sweepZip.build(s, { exportedAt: this.clock.now(), userId: user.id });
    this.startZip(res, fileName);
    await this.send(zip, res, `export of sweep ${id}`);
  }

  async dataset(user: AuthUser, id: number, res: Response): Promise<void> {
    const d = this.datasets.readable(user, id);
    const { zip } = this.datasetZip.build(d, this.clock.now());
    this.startZip(res, this.datasetZip.fileName(d));
    await this.send(zip, res, `export of dataset ${id}`);
  }

  private startZip(res: Response, fileName: string): void {
    res.setHeader('Content-Type', 'application/zip');
    res.setHeader('Content-Disposition', attachment(fileName));
    res.setHeader('Cache-Control', 'no-store');
  }

  /** Streams with back-pressure; a client that goes away just ends the pipeline. */
  private async send(source: Readable, res: Response, what: string): Promise<void> {
    try {
      await pipeline(source, res);
    } catch (err) {
      const e = err as NodeJS.ErrnoException;
      if (e.code === 'ERR_STREAM_PREMATURE_CLOSE' || res.destroyed) return;
      this.logger.error(`${what} failed: ${e.message}`);
      res.destroy(e);
    }
  }
}
