import fs from 'node:fs';
import path from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import { openDatabase } from '../../api/src/db/database.js';
import { tempDataDir } from '../support/app.js';

const dirs: string[] = [];
afterEach(() => {
  for (const d of dirs.splice(0)) fs.rmSync(d, { recursive: true, force: true });
});

describe('SQLite with migrations applied', () => {
  it('creates the file in WAL mode with every table and reports a new database once', () => {
    const dir = tempDataDir();
    dirs.push(dir);
    const file = path.join(dir, 'driftgrid.db');
    const first = openDatabase(file);
    expect(first.created).toBe(true);
    expect(first.sqlite.pragma('journal_mode', { simple: true })).toBe('wal');
    const tables = first.sqlite
      .prepare("select name from sqlite_master where type='table'")
      .all()
      .map((r) => (r as { name: string }).name);
    expect(tables).toEqual(
      expect.arrayContaining([
        'users',
        'sweeps',
        'sweep_chunks',
        'results',
        'datasets',
        'fits',
        'api_tokens',
        'audit_log',
      ]),
    );
    first.sqlite
      .prepare(
        "insert into users (email,name,role,password_hash,created_at,updated_at) values ('a@b.c','A','admin','x',1,1)",
      )
      .run();
    first.sqlite.close();
    const second = openDatabase(file);
    expect(second.created).toBe(false);
    expect(second.sqlite.prepare('select count(*) n from users').get()).toEqual({ n: 1 });
    expect(second.sqlite.pragma('integrity_check', { simple: true })).toBe('ok');
    second.sqlite.close();
  });

  it('enforces unique e-mail addresses', () => {
    const dir = tempDataDir();
    dirs.push(dir);
    const { sqlite } = openDatabase(path.join(dir, 'driftgrid.db'));
    const ins = sqlite.prepare(
      'insert into users (email,name,role,password_hash,created_at,updated_at) values (?,?,?,?,1,1)',
    );
    ins.run('a@b.c', 'A', 'admin', 'x');
    expect(() => ins.run('a@b.c', 'B', 'reviewer', 'y')).toThrow(/UNIQUE/);
    sqlite.close();
  });
});

describe('demo seed', () => {
  it('gives every demo account its own salt', async () => {
    const { startTestApp } = await import('../support/app.js');
    const t = await startTestApp();
    try {
      const rows = t.sqlite().prepare('SELECT password_hash AS h FROM users').all() as { h: string }[];
      expect(rows.length).toBe(3);
      expect(new Set(rows.map((r) => r.h)).size).toBe(3);
    } finally {
      await t.close();
    }
  });
});
