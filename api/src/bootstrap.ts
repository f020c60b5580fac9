import 'reflect-metadata';
import { Logger, type INestApplication } from '@nestjs/common';
import { NestFactory } from '@nestjs/core';
import type { NestExpressApplication } from '@nestjs/platform-express';
import { DocumentBuilder, SwaggerModule } from '@nestjs/swagger';
import helmet from 'helmet';
import { AppModule } from './app.module.js';
import { AppLogger } from './common/app-logger.js';
import { noStoreOnSecrets } from './auth/no-store.js';
import { requestContext } from './common/request-context.middleware.js';
import type { AppConfig } from './config/app-config.js';
import { SeedService } from './seed/seed.service.js';
import { seedDemoContent } from './seed/demo-content.js';
import { jsonBodiesOnly } from './web/json-only.js';
import { mountUi } from './web/spa-fallback.js';

export interface CreatedApp {
  app: INestApplication;
  seeded: boolean;
}

/** Builds the whole application (not yet listening): used by main.ts and by the api tests. */
export async function createApp(config: AppConfig): Promise<CreatedApp> {
  const app = await NestFactory.create<NestExpressApplication>(AppModule.forRoot(config), {
    logger: new AppLogger(config.logLevel, config.env === 'test'),
    bodyParser: false,
  });
  app.disable('x-powered-by');
  app.set('trust proxy', 'loopback');
  app.set('query parser', 'simple');
  app.use(requestContext(config));
  app.use(noStoreOnSecrets());
  app.use(
    helmet({
      contentSecurityPolicy: {
        useDefaults: true,
        directives: {
          'img-src': ["'self'", 'data:', 'blob:'],
          'connect-src': ["'self'"],
          'upgrade-insecure-requests': null,
        },
      },
      crossOriginEmbedderPolicy: false,
    }),
  );
  app.use(jsonBodiesOnly());
  app.useBodyParser('json', { limit: '2mb' });
  app.setGlobalPrefix('api');
  app.enableShutdownHooks();

  const docs = new DocumentBuilder()
    .setTitle('Driftgrid API')
    .setDescription(
      'Parameter sweeps, results catalogue and fits for fluid drifts and parallel force balance. Canonical units: SI, temperatures in eV.',
    )
    .setVersion(config.appVersion)
    .addBearerAuth()
    .build();
  SwaggerModule.setup('api/docs', app, () => SwaggerModule.createDocument(app, docs), {
    jsonDocumentUrl: 'api/docs/openapi.json',
  });

  const seeder = app.get(SeedService);
  await seeder.assertNoDemoCredentials();
  let seeded = false;
  if (seeder.shouldSeed()) {
    await seeder.seedUsers();
    seeded = true;
  }
  await app.init();
  // Example sweeps, a dataset and a fit go through the running services (queue included).
  if (seeded && config.seedDemoContent) await seedDemoContent(app);
  if (!mountUi(app.getHttpAdapter().getInstance(), config.uiDist)) {
    new Logger('Web').warn(`No built ui at ${config.uiDist}; serving the api only (run npm run build)`);
  }
  return { app, seeded };
}
