import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { INestApplication } from '@nestjs/common';
import request from 'supertest';
import { loadConfig, type AppConfig } from '../../api/src/config/app-config.js';
import { createApp } from '../../api/src/bootstrap.js';
import { DEMO_PASSWORD } from '../../api/src/seed/demo-users.js';
import { DB_HANDLE } from '../../api/src/db/db.module.js';
import type { OpenedDatabase } from '../../api/src/db/database.js';
import type Database from 'better-sqlite3';

export interface TestApp {
  app: INestApplication;
  config: AppConfig;
  dataDir: string;
  http: ReturnType<typeof request>;
  /** Signs in and returns the bearer token. */
  login(email: string, password?: string): Promise<string>;
  /** The app's own SQLite connection, for checks against the stored data. */
  sqlite(): Database.Database;
  close(): Promise<void>;
}

/** A fresh temporary DATA_DIR per app, so every suite starts from a new, seeded database. */
export function tempDataDir(prefix = 'driftgrid-test-'): string {
  return fs.mkdtempSync(path.join(os.tmpdir(), prefix));
}

export async function startTestApp(env: Record<string, string> = {}): Promise<TestApp> {
  const dataDir = env.DATA_DIR ?? tempDataDir();
  const config = loadConfig({
    NODE_ENV: 'test',
    DATA_DIR: dataDir,
    LOG_LEVEL: 'error',
    DEMO_SEED: 'true',
    PORT: '0',
    ...env,
  });
  const { app } = await createApp(config);
  const server = app.getHttpServer();
  const http = request(server);
  return {
    app,
    config,
    dataDir,
    http,
    async login(email, password = DEMO_PASSWORD) {
      const res = await request(server).post('/api/auth/login').send({ email, password });
      if (res.status !== 200) throw new Error(`login ${email} failed: ${res.status} ${JSON.stringify(res.body)}`);
      return res.body.accessToken as string;
    },
    sqlite: () => app.get<OpenedDatabase>(DB_HANDLE).sqlite,
    async close() {
      await app.close();
      if (!env.DATA_DIR) fs.rmSync(dataDir, { recursive: true, force: true });
    },
  };
}

export const DEMO = {
  admin: 'admin@example.com',
  researcher: 'researcher@example.com',
  reviewer: 'reviewer@example.com',
} as const;
