/**
 * Demo seed step for sweeps: submits every definition in examples/*.json as the demo researcher,
 * through SweepsService.create, so the demo catalogue fills by the same path (validation, quota,
 * queue) a real submission takes. Called from bootstrap after the demo users exist.
 */
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { Logger, type INestApplication } from '@nestjs/common';
import type { AuthUser } from '../auth/current-user.js';
import { SweepsService } from '../sweeps/sweeps.service.js';
import { UsersRepository } from '../users/users.repository.js';
import { DEMO_USERS } from './demo-users.js';

const here = path.dirname(fileURLToPath(import.meta.url));
/** api/src/seed and api/dist/seed both sit three levels below the repository root. */
export const EXAMPLES_DIR = path.resolve(here, '../../..', 'examples');

/** The example definitions in file-name order (stable seed order). */
export function readExampleDefinitions(dir = EXAMPLES_DIR): { file: string; definition: unknown }[] {
  if (!fs.existsSync(dir)) return [];
  return fs
    .readdirSync(dir)
    .filter((f) => f.endsWith('.json'))
    .sort()
    .map((file) => ({ file, definition: JSON.parse(fs.readFileSync(path.join(dir, file), 'utf8')) as unknown }));
}

/**
 * Submits the examples as the demo researcher; returns the new sweep ids. A definition the server
 * refuses is logged and skipped, so one stale example never blocks the start.
 */
export async function seedDemoSweeps(app: INestApplication, dir = EXAMPLES_DIR): Promise<number[]> {
  const logger = new Logger('Seed');
  const users = app.get(UsersRepository);
  const sweeps = app.get(SweepsService);
  const email = DEMO_USERS.find((u) => u.role === 'researcher')!.email;
  const row = users.findByEmail(email);
  if (!row) {
    logger.warn(`No demo researcher (${email}); no example sweeps seeded`);
    return [];
  }
  const owner: AuthUser = {
    id: row.id,
    email: row.email,
    name: row.name,
    role: row.role,
    via: 'session',
    scope: 'read-write',
  };
  const ids: number[] = [];
  for (const { file, definition } of readExampleDefinitions(dir)) {
    try {
      const created = await sweeps.create(owner, definition, { enforceQuota: false });
      ids.push(created.id);
    } catch (err) {
      logger.warn(`Example ${file} not seeded: ${(err as Error).message}`);
    }
  }
  logger.log(`Submitted ${ids.length} example sweeps from examples/ as ${email}`);
  return ids;
}
