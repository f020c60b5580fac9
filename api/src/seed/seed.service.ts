import { Inject, Injectable, Logger } from '@nestjs/common';
import { PasswordHasher } from '../auth/password-hasher.js';
import { Clock } from '../common/clock.js';
import { APP_CONFIG, type AppConfig } from '../config/app-config.js';
import { DB_HANDLE } from '../db/db.module.js';
import type { OpenedDatabase } from '../db/database.js';
import { UsersRepository } from '../users/users.repository.js';
import { DEMO_PASSWORD, DEMO_USERS } from './demo-users.js';

/** A step of the demo seed contributed by a feature module (sweeps, datasets, fits). */
export abstract class DemoSeedStep {
  abstract readonly order: number;
  abstract run(users: Record<string, number>): Promise<void>;
}

/** Seeds the demo only when the database file was created by this start. */
@Injectable()
export class SeedService {
  private readonly logger = new Logger('Seed');

  constructor(
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    @Inject(DB_HANDLE) private readonly handle: OpenedDatabase,
    private readonly users: UsersRepository,
    private readonly hasher: PasswordHasher,
    private readonly clock: Clock,
  ) {}

  shouldSeed(): boolean {
    return this.config.seedDemo && this.handle.created && this.users.count() === 0;
  }

  /**
   * Production refuses a database whose demo accounts still open with the published demo password
   * (e.g. a DATA_DIR first started in development), unless ALLOW_INSECURE_DEMO=true.
   */
  async assertNoDemoCredentials(): Promise<void> {
    if (this.config.env !== 'production' || this.config.allowInsecureDemo) return;
    for (const u of DEMO_USERS) {
      const row = this.users.findByEmail(u.email);
      if (row?.active && (await this.hasher.verify(DEMO_PASSWORD, row.passwordHash))) {
        throw new Error(
          `Refusing to start in production: the demo user ${u.email} still has the demo password; change or deactivate it (or set ALLOW_INSECURE_DEMO=true for a trial).`,
        );
      }
    }
  }

  async seedUsers(): Promise<Record<string, number>> {
    // One hash (and salt) per account, as for any user: equal hashes would reveal equal passwords.
    const hashes = await Promise.all(DEMO_USERS.map(() => this.hasher.hash(DEMO_PASSWORD)));
    const now = this.clock.now();
    const ids: Record<string, number> = {};
    DEMO_USERS.forEach((u, i) => {
      ids[u.role] = this.users.insert({
        ...u,
        passwordHash: hashes[i],
        active: true,
        createdAt: now,
        updatedAt: now,
      }).id;
    });
    this.logger.log(`Seeded ${DEMO_USERS.length} demo users`);
    return ids;
  }
}
