import { Module } from '@nestjs/common';
import { APP_CONFIG, type AppConfig } from '../config/app-config.js';
import { DB_HANDLE } from '../db/db.module.js';
import type { OpenedDatabase } from '../db/database.js';
import { HeavyReads } from './heavy-reads.js';
import { OrderCache } from './order-cache.js';
import { PooledHeavyReads } from './read-pool.js';

/** The heavy-read pool and the cache of sorted orders; modules that read results (sweeps, catalogue, sensitivity) import it. */
@Module({
  providers: [
    {
      provide: HeavyReads,
      inject: [APP_CONFIG, DB_HANDLE],
      useFactory: (config: AppConfig, handle: OpenedDatabase) =>
        new PooledHeavyReads({ dbFile: config.dbFile, ...config.reads }, handle.sqlite),
    },
    {
      provide: OrderCache,
      inject: [APP_CONFIG],
      useFactory: (config: AppConfig) => new OrderCache(config.reads.orderCacheBytes),
    },
  ],
  exports: [HeavyReads, OrderCache],
})
export class ReadsModule {}
