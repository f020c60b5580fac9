/**
 * The quota_ledger migration backfills the ledger from the sweeps an existing database already
 * holds, so nobody's 30-day usage drops when the ledger takes over from the sweeps table.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import Database from 'better-sqlite3';
import { drizzle } from 'drizzle-orm/better-sqlite3';
import { migrate } from 'drizzle-orm/better-sqlite3/migrator';
import { afterAll, describe, expect, it } from 'vitest';
import { MIGRATIONS_DIR } from '../../api/src/db/database.js';

const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'driftgrid-ledger-mig-'));
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

/** A copy of drizzle/ holding only the migrations before `tag`. */
function migrationsBefore(tag: string): string {
  const out = path.join(dir, 'before');
  fs.cpSync(MIGRATIONS_DIR, out, { recursive: true });
  const journalFile = path.join(out, 'meta', '_journal.json');
  const journal = JSON.parse(fs.readFileSync(journalFile, 'utf8')) as { entries: { idx: number; tag: string }[] };
  const cut = journal.entries.findIndex((e) => e.tag === tag);
  expect(cut).toBeGreaterThan(0);
  journal.entries = journal.entries.slice(0, cut);
  fs.writeFileSync(journalFile, JSON.stringify(journal));
  return out;
}

describe('0002_quota_ledger backfill', () => {
  it('charges every submitted, undeleted sweep at its creation time, drafts excluded', () => {
    const sqlite = new Database(path.join(dir, 'old.db'));
    const db = drizzle(sqlite);
    migrate(db, { migrationsFolder: migrationsBefore('0002_quota_ledger') });
    const uid = Number(
      sqlite
        .prepare(
          "INSERT INTO users (email, name, role, password_hash, created_at, updated_at) VALUES ('rosa@example.com', 'Rosa', 'researcher', 'x', 1, 1)",
        )
        .run().lastInsertRowid,
    );
    const add = sqlite.prepare(
      `INSERT INTO sweeps (owner_id, name, model, model_version, app_version, status, definition, columns, points, chunk_count, created_at, deleted_at)
       VALUES (?, 'argon column scan', 'cross-field', '1', '0.1.0', ?, '{}', '[]', ?, 1, ?, ?)`,
    );
    add.run(uid, 'completed', 400, 1000, null);
    add.run(uid, 'cancelled', 3200, 2000, null);
    add.run(uid, 'failed', 1600, 3000, null);
    add.run(uid, 'draft', 6400, 4000, null);
    add.run(uid, 'completed', 12800, 5000, 6000); // was already excluded from usage
    migrate(db, { migrationsFolder: MIGRATIONS_DIR });
    const rows = sqlite
      .prepare('SELECT user_id AS u, points, charged_at AS at FROM quota_ledger ORDER BY charged_at')
      .all();
    expect(rows).toEqual([
      { u: uid, points: 400, at: 1000 },
      { u: uid, points: 3200, at: 2000 },
      { u: uid, points: 1600, at: 3000 },
    ]);
    sqlite.close();
  });
});
