import { ConfigError, loadConfig } from './config/app-config.js';
import { assertDataDirUsable } from './config/data-dir-check.js';
import { createApp } from './bootstrap.js';
import { DEMO_PASSWORD, DEMO_USERS } from './seed/demo-users.js';

async function main(): Promise<void> {
  let config;
  try {
    config = loadConfig();
    assertDataDirUsable(config);
  } catch (e) {
    if (e instanceof ConfigError) {
      console.error(e.message);
      process.exit(2);
    }
    throw e;
  }
  const { app } = await createApp(config);
  await app.listen(config.port, config.host);
  // Longer than the usual client and proxy idle timeouts, so a reused keep-alive socket is not reset.
  const server = app.getHttpServer() as import('node:http').Server;
  server.keepAliveTimeout = 65_000;
  server.headersTimeout = 66_000;
  const url = `http://localhost:${config.port}`;
  const lines = [
    `Driftgrid ${config.appVersion} is serving ${url} (api docs: ${url}/api/docs)`,
    `data: ${config.dataDir}`,
  ];
  if (config.seedDemo) {
    lines.push(
      `demo sign-ins (password "${DEMO_PASSWORD}", demo only): ${DEMO_USERS.map((u) => `${u.email} (${u.role})`).join(', ')}`,
    );
  }
  console.log(lines.join('\n'));
}

main().catch((e) => {
  console.error('Driftgrid failed to start:', e instanceof Error ? e.message : e);
  process.exit(1);
});
