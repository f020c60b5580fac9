import fs from 'node:fs';
import type { AppConfig } from './app-config.js';
import { ConfigError } from './app-config.js';

/**
 * Checked before the app is built, so an unusable DATA_DIR is one clear line at start-up rather
 * than a framework stack trace: the directory must exist or be creatable and be writable, and
 * driftgrid.db, when present, must be a file.
 */
export function assertDataDirUsable(config: Pick<AppConfig, 'dataDir' | 'dbFile'>): void {
  const fail = (why: string) => {
    throw new ConfigError(`DATA_DIR ${config.dataDir} cannot be used: ${why}. Set DATA_DIR to a writable directory.`);
  };
  try {
    fs.mkdirSync(config.dataDir, { recursive: true });
  } catch (e) {
    fail(`it cannot be created (${(e as NodeJS.ErrnoException).code ?? (e as Error).message})`);
  }
  if (!fs.statSync(config.dataDir).isDirectory()) fail('it is not a directory');
  try {
    fs.accessSync(config.dataDir, fs.constants.W_OK);
  } catch {
    fail('it is not writable');
  }
  if (fs.existsSync(config.dbFile) && !fs.statSync(config.dbFile).isFile())
    fail(`${config.dbFile} exists but is not a file`);
}
