import path from 'node:path';
import { backup, restore } from './backup.js';

/**
 * npm run backup [-- --out DIR]          consistent online copy of $DATA_DIR (default ./data)
 * npm run restore -- --from DIR          into a fresh $DATA_DIR
 */
function arg(name: string): string | undefined {
  const i = process.argv.indexOf(`--${name}`);
  return i >= 0 ? process.argv[i + 1] : undefined;
}

async function main(): Promise<void> {
  const dataDir = path.resolve(arg('data-dir') ?? process.env.DATA_DIR ?? './data');
  const mode = process.argv[2];
  if (mode === 'restore') {
    const from = arg('from');
    if (!from) throw new Error('restore needs --from <backup folder>');
    const m = restore(path.resolve(from), dataDir);
    console.log(
      `Restored ${m.database.file} (${m.database.bytes} bytes) and ${m.archives.length} archives into ${dataDir}`,
    );
    return;
  }
  const stamp = new Date().toISOString().replace(/[:.]/g, '-');
  const out = path.resolve(arg('out') ?? path.join('backups', `driftgrid-${stamp}`));
  const m = await backup(dataDir, out);
  console.log(
    `Backup written to ${out}: database ${m.database.bytes} bytes (integrity ${m.database.integrity}), ${m.archives.length} archives`,
  );
}

main().catch((e) => {
  console.error(`backup failed: ${(e as Error).message}`);
  process.exit(1);
});
