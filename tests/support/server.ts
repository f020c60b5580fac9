import type { AddressInfo } from 'node:net';
import { startTestApp, type TestApp } from './app.js';

export interface RunningServer extends TestApp {
  baseUrl: string;
}

/** The full app listening on an ephemeral loopback port, serving the built ui. */
export async function startServer(env: Record<string, string> = {}): Promise<RunningServer> {
  const t = await startTestApp(env);
  await t.app.listen(0, '127.0.0.1');
  const port = (t.app.getHttpServer().address() as AddressInfo).port;
  return { ...t, baseUrl: `http://127.0.0.1:${port}` };
}
