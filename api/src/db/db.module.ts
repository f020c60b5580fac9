import { Global, Inject, Module, type OnApplicationShutdown } from '@nestjs/common';
import { APP_CONFIG, type AppConfig } from '../config/app-config.js';
import { openDatabase, type Db, type OpenedDatabase } from './database.js';
import { Transactions } from './transactions.js';

export const DB = Symbol('DB');
export const DB_HANDLE = Symbol('DB_HANDLE');

@Global()
@Module({
  providers: [
    {
      provide: DB_HANDLE,
      inject: [APP_CONFIG],
      useFactory: (config: AppConfig): OpenedDatabase => openDatabase(config.dbFile),
    },
    { provide: DB, inject: [DB_HANDLE], useFactory: (h: OpenedDatabase): Db => h.db },
    { provide: Transactions, inject: [DB_HANDLE], useFactory: (h: OpenedDatabase) => new Transactions(h.sqlite) },
  ],
  exports: [DB, DB_HANDLE, Transactions],
})
export class DbModule implements OnApplicationShutdown {
  constructor(@Inject(DB_HANDLE) private readonly handle: OpenedDatabase) {}

  onApplicationShutdown(): void {
    if (this.handle.sqlite.open) this.handle.sqlite.close();
  }
}
