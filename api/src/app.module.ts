import { Module, type DynamicModule } from '@nestjs/common';
import { APP_FILTER } from '@nestjs/core';
import { PeopleModule } from './accounts/people.module.js';
import { AuthModule } from './auth/auth.module.js';
import { HttpErrorFilter } from './common/http-error.filter.js';
import type { AppConfig } from './config/app-config.js';
import { ConfigModule } from './config/config.module.js';
import { DbModule } from './db/db.module.js';
import { HealthModule } from './health/health.module.js';
import { SeedModule } from './seed/seed.module.js';
import { QueueRootModule } from './queue/queue.module.js';
import { SweepsModule } from './sweeps/sweeps.module.js';
import { ExportModule } from './export/export.module.js';
import { ModelsModule } from './models/models.module.js';
import { CatalogueModule } from './catalogue/catalogue.module.js';
import { FitsModule } from './fits/fits.module.js';
import { SensitivityModule } from './sensitivity/sensitivity.module.js';

@Module({})
export class AppModule {
  static forRoot(config: AppConfig): DynamicModule {
    return {
      module: AppModule,
      imports: [
        ConfigModule.forRoot(config),
        DbModule,
        AuthModule,
        HealthModule,
        SeedModule,
        PeopleModule,
        QueueRootModule.forRoot(config),
        SweepsModule,
        ModelsModule,
        CatalogueModule,
        FitsModule,
        SensitivityModule,
        ExportModule,
      ],
      providers: [{ provide: APP_FILTER, useClass: HttpErrorFilter }],
    };
  }
}
