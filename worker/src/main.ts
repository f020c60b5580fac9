import 'reflect-metadata';
import { NestFactory } from '@nestjs/core';
import { loadWorkerConfig } from './worker-config.js';
import { WorkerModule } from './worker.module.js';

async function main(): Promise<void> {
  const config = loadWorkerConfig();
  const app = await NestFactory.createApplicationContext(WorkerModule.forRoot(config), {
    logger: ['log', 'warn', 'error'],
  });
  app.enableShutdownHooks();
  console.log(`Driftgrid worker ${config.workerId} started (concurrency ${config.concurrency})`);
}

main().catch((e) => {
  console.error('Driftgrid worker failed to start:', e instanceof Error ? e.message : e);
  process.exit(1);
});
