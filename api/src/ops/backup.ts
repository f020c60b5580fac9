import Database from 'better-sqlite3';
import { createHash } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';

export interface BackupManifest {
  createdAt: string;
  database: { file: string; bytes: number; sha256: string; integrity: string };
  archives: { file: string; bytes: number; sha256: string }[];
}

function sha256File(file: string): string {
  const h = createHash('sha256');
  const fd = fs.openSync(file, 'r');
  const buf = Buffer.allocUnsafe(1 << 20);
  try {
    for (let n; (n = fs.readSync(fd, buf, 0, buf.length, null)) > 0;) h.update(buf.subarray(0, n));
  } finally {
    fs.closeSync(fd);
  }
  return h.digest('hex');
}

/**
 * A consistent online copy of DATA_DIR: the SQLite database through the driver's backup API (safe while
 * the api writes), then the archive zips, with a manifest of SHA-256 sums. Archives are immutable, so
 * copying them after the database snapshot cannot miss one the snapshot refers to... except one archived
 * during the copy, which the snapshot does not reference yet (it is copied too if present).
 */
export async function backup(dataDir: string, outDir: string): Promise<BackupManifest> {
  const dbFile = path.join(dataDir, 'driftgrid.db');
  if (!fs.existsSync(dbFile)) throw new Error(`No database at ${dbFile}`);
  fs.mkdirSync(outDir, { recursive: true });
  if (fs.readdirSync(outDir).length) throw new Error(`Backup folder ${outDir} is not empty`);
  const src = new Database(dbFile, { readonly: true, fileMustExist: true });
  const dest = path.join(outDir, 'driftgrid.db');
  try {
    await src.backup(dest);
  } finally {
    src.close();
  }
  const check = new Database(dest, { readonly: true });
  const integrity = String(check.pragma('integrity_check', { simple: true }));
  check.close();
  if (integrity !== 'ok') throw new Error(`The backup copy failed its integrity check: ${integrity}`);
  const archives: BackupManifest['archives'] = [];
  const archiveDir = path.join(dataDir, 'archives');
  if (fs.existsSync(archiveDir)) {
    fs.mkdirSync(path.join(outDir, 'archives'));
    for (const f of fs
      .readdirSync(archiveDir)
      .filter((x) => x.endsWith('.zip'))
      .sort()) {
      const to = path.join(outDir, 'archives', f);
      fs.copyFileSync(path.join(archiveDir, f), to);
      archives.push({ file: `archives/${f}`, bytes: fs.statSync(to).size, sha256: sha256File(to) });
    }
  }
  const manifest: BackupManifest = {
    createdAt: new Date().toISOString(),
    database: { file: 'driftgrid.db', bytes: fs.statSync(dest).size, sha256: sha256File(dest), integrity },
    archives,
  };
  fs.writeFileSync(path.join(outDir, 'backup-manifest.json'), JSON.stringify(manifest, null, 2));
  return manifest;
}

/** Restores a backup into a fresh DATA_DIR after checking every SHA-256 and the database's integrity. */
export function restore(backupDir: string, dataDir: string): BackupManifest {
  const manifest = JSON.parse(fs.readFileSync(path.join(backupDir, 'backup-manifest.json'), 'utf8')) as BackupManifest;
  if (fs.existsSync(path.join(dataDir, 'driftgrid.db')))
    throw new Error(`${dataDir} already holds a database; restore into a fresh DATA_DIR`);
  for (const f of [manifest.database, ...manifest.archives]) {
    const got = sha256File(path.join(backupDir, f.file));
    if (got !== f.sha256) throw new Error(`${f.file} does not match its SHA-256 in the manifest`);
  }
  fs.mkdirSync(path.join(dataDir, 'archives'), { recursive: true });
  fs.copyFileSync(path.join(backupDir, manifest.database.file), path.join(dataDir, 'driftgrid.db'));
  for (const a of manifest.archives) fs.copyFileSync(path.join(backupDir, a.file), path.join(dataDir, a.file));
  const db = new Database(path.join(dataDir, 'driftgrid.db'));
  const integrity = String(db.pragma('integrity_check', { simple: true }));
  db.close();
  if (integrity !== 'ok') throw new Error(`Restored database failed its integrity check: ${integrity}`);
  return manifest;
}
