/**
 * Demo content beyond users: the example sweeps, one uploaded probe dataset and one fit on it,
 * all created through the same services a user's requests go through.
 */
import fs from 'node:fs';
import path from 'node:path';
import { Logger, type INestApplication } from '@nestjs/common';
import type { AuthUser } from '../auth/current-user.js';
import { DatasetsService } from '../datasets/datasets.service.js';
import { FitsService } from '../fits/fits.service.js';
import { UsersRepository } from '../users/users.repository.js';
import { DEMO_USERS } from './demo-users.js';
import { EXAMPLES_DIR, seedDemoSweeps } from './demo-sweeps.js';

const PROBE_FILE = path.join(EXAMPLES_DIR, 'datasets', 'argon-probe-profile.csv');

function demoResearcher(app: INestApplication): AuthUser | null {
  const row = app.get(UsersRepository).findByEmail(DEMO_USERS.find((u) => u.role === 'researcher')!.email);
  return row
    ? { id: row.id, email: row.email, name: row.name, role: row.role, via: 'session', scope: 'read-write' }
    : null;
}

export async function seedDemoContent(app: INestApplication): Promise<void> {
  const logger = new Logger('Seed');
  await seedDemoSweeps(app);
  const owner = demoResearcher(app);
  if (!owner || !fs.existsSync(PROBE_FILE)) return;
  try {
    const buffer = fs.readFileSync(PROBE_FILE);
    const ds = app.get(DatasetsService).upload(
      owner,
      { buffer, originalname: 'argon-probe-profile.csv', size: buffer.length },
      {
        name: 'Argon column probe profile (demo)',
        units: { r: 'cm', phi: 'V', n: 'cm^-3' },
        visibility: 'group',
      },
    );
    // The Boltzmann form n = A·exp(φ/s): the fitted s is the electron temperature in eV.
    await app
      .get(FitsService)
      .create(owner, { source: { kind: 'dataset', id: ds.id }, model: 'exponential', y: 'n', x: 'phi' } as never);
    logger.log(`Seeded the demo dataset ${ds.id} and a Boltzmann fit on it`);
  } catch (e) {
    logger.warn(`Demo dataset or fit not seeded: ${(e as Error).message}`);
  }
}
