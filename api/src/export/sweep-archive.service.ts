import { createHash, randomBytes } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { Transform } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import { Inject, Injectable, Logger } from '@nestjs/common';
import { ConflictError } from '@driftgrid/domain';
import type { AuthUser } from '../auth/current-user.js';
import { Clock } from '../common/clock.js';
import { APP_CONFIG, type AppConfig } from '../config/app-config.js';
import { SweepAccess } from '../sweeps/sweep-access.js';
import { SweepsRepository } from '../sweeps/sweeps.repository.js';
import { SweepsService } from '../sweeps/sweeps.service.js';
import { SweepExportBuilder } from './sweep-export.service.js';

/** Where an archived sweep's zip lives; only the base name is stored, never a client-supplied path. */
export function archivePath(config: AppConfig, archiveFile: string): string {
  return path.join(config.archiveDir, path.basename(archiveFile));
}

/**
 * Archives a completed sweep: the export is built once into archiveDir (temp file, fsync, rename),
 * its SHA-256 and size are recorded, and the status moves completed → archived in one
 * compare-and-set. Fits attached later are not added to the frozen zip.
 */
@Injectable()
export class SweepArchiver {
  private readonly logger = new Logger('SweepArchiver');
  /** Sweeps being archived right now in this process (a second request gets 409). */
  private readonly busy = new Set<number>();

  constructor(
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    private readonly access: SweepAccess,
    private readonly repo: SweepsRepository,
    private readonly sweeps: SweepsService,
    private readonly builder: SweepExportBuilder,
    private readonly clock: Clock,
  ) {}

  async archive(user: AuthUser, id: number) {
    const s = this.access.manageable(user, id);
    if (s.status !== 'completed') {
      throw new ConflictError(`Sweep ${id} is ${s.status}; only completed sweeps can be archived`, [
        { path: 'status', message: `is ${s.status}, must be completed` },
      ]);
    }
    if (this.busy.has(id)) throw new ConflictError(`Sweep ${id} is being archived already`);
    this.busy.add(id);
    try {
      const now = this.clock.now();
      const file = await this.writeArchive(id, now, user.id);
      const ok = this.repo.transition(id, ['completed'], {
        status: 'archived',
        archivedAt: now,
        archiveSha256: file.sha256,
        archiveBytes: file.bytes,
        archiveFile: file.name,
      });
      if (!ok) {
        await fs.promises.rm(file.fullPath, { force: true });
        const current = this.repo.findById(id);
        throw new ConflictError(`Sweep ${id} changed to ${current?.status ?? 'deleted'} while it was being archived`);
      }
      this.logger.log(`sweep ${id} archived: ${file.name} (${file.bytes} bytes, sha256 ${file.sha256})`);
      return this.sweeps.present(this.repo.findById(id)!);
    } finally {
      this.busy.delete(id);
    }
  }

  private async writeArchive(
    id: number,
    now: number,
    userId: number,
  ): Promise<{ name: string; fullPath: string; sha256: string; bytes: number }> {
    const s = this.repo.findById(id)!;
    await fs.promises.mkdir(this.config.archiveDir, { recursive: true });
    const tmp = path.join(this.config.archiveDir, `.sweep-${id}-${randomBytes(6).toString('hex')}.part`);
    const hash = createHash('sha256');
    let bytes = 0;
    const tap = new Transform({
      transform(chunk: Buffer, _enc, cb) {
        hash.update(chunk);
        bytes += chunk.length;
        cb(null, chunk);
      },
    });
    const { zip } = this.builder.build(s, { exportedAt: now, archivedAt: now, userId });
    try {
      await pipeline(zip, tap, fs.createWriteStream(tmp, { flags: 'wx', mode: 0o640 }));
      // fsync applies to the file, whichever descriptor asks: make the bytes durable before the rename.
      const handle = await fs.promises.open(tmp, 'r+');
      try {
        await handle.sync();
      } finally {
        await handle.close();
      }
    } catch (err) {
      await fs.promises.rm(tmp, { force: true });
      throw err;
    }
    const sha256 = hash.digest('hex');
    const name = `sweep-${id}-${sha256.slice(0, 12)}.zip`;
    const fullPath = path.join(this.config.archiveDir, name);
    await fs.promises.rename(tmp, fullPath);
    await this.syncDir();
    return { name, fullPath, sha256, bytes };
  }

  /** Makes the rename durable; some file systems cannot fsync a directory, which is not fatal. */
  private async syncDir(): Promise<void> {
    try {
      const dir = await fs.promises.open(this.config.archiveDir, 'r');
      try {
        await dir.sync();
      } finally {
        await dir.close();
      }
    } catch {
      /* best effort */
    }
  }
}
