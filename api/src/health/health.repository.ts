import { Inject, Injectable } from '@nestjs/common';
import type { Statement } from 'better-sqlite3';
import { DB_HANDLE } from '../db/db.module.js';
import type { OpenedDatabase } from '../db/database.js';

/** The database liveness probe behind /api/health. */
@Injectable()
export class HealthRepository {
  private readonly ping: Statement;

  constructor(@Inject(DB_HANDLE) handle: OpenedDatabase) {
    this.ping = handle.sqlite.prepare('SELECT 1');
  }

  /** Throws when the connection cannot answer (closed, or the file is unreadable). */
  answer(): void {
    this.ping.get();
  }
}
