import { spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import net from 'node:net';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

export const REPO = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');

export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = net.createServer();
    srv.listen(0, '127.0.0.1', () => {
      const port = (srv.address() as net.AddressInfo).port;
      srv.close(() => resolve(port));
    });
    srv.on('error', reject);
  });
}

export interface Proc {
  child: ChildProcess;
  output: () => string;
  /** Resolves when the process has exited. */
  exited: Promise<number | null>;
  kill(signal?: NodeJS.Signals): Promise<void>;
}

/** Runs a built script; `nodeArgs` are node's own flags (e.g. --cpu-prof, refused in NODE_OPTIONS). */
export function spawnNode(script: string, env: Record<string, string>, nodeArgs: string[] = []): Proc {
  const file = path.join(REPO, script);
  if (!fs.existsSync(file)) throw new Error(`${script} is not built: run npm run build first`);
  const child = spawn(process.execPath, [...nodeArgs, file], {
    env: { ...process.env, ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let out = '';
  child.stdout!.on('data', (d) => (out = (out + d).slice(-20000)));
  child.stderr!.on('data', (d) => (out = (out + d).slice(-20000)));
  const exited = new Promise<number | null>((r) => child.on('exit', (code) => r(code)));
  return {
    child,
    exited,
    output: () => out,
    async kill(signal = 'SIGTERM') {
      if (child.exitCode === null && child.signalCode === null) child.kill(signal);
      await exited;
    },
  };
}

export async function waitForHealth(baseUrl: string, proc: Proc, timeoutMs = 30_000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    if (proc.child.exitCode !== null) throw new Error(`process exited early:\n${proc.output()}`);
    try {
      const r = await fetch(`${baseUrl}/api/health`);
      if (r.ok) return;
    } catch {
      /* not listening yet */
    }
    if (Date.now() > deadline) throw new Error(`no health answer from ${baseUrl}:\n${proc.output()}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

export async function startApiProcess(env: Record<string, string>): Promise<{ proc: Proc; baseUrl: string }> {
  const port = await freePort();
  const proc = spawnNode('api/dist/main.js', {
    NODE_ENV: 'test',
    LOG_LEVEL: 'warn',
    HOST: '127.0.0.1',
    PORT: String(port),
    DEMO_SEED: 'true',
    ...env,
  });
  const baseUrl = `http://127.0.0.1:${port}`;
  await waitForHealth(baseUrl, proc);
  return { proc, baseUrl };
}

export async function apiLogin(baseUrl: string, email: string, password = 'driftgrid-demo'): Promise<string> {
  const r = await fetch(`${baseUrl}/api/auth/login`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email, password }),
  });
  if (!r.ok) throw new Error(`login failed ${r.status}`);
  return ((await r.json()) as { accessToken: string }).accessToken;
}

export async function apiJson(baseUrl: string, token: string, method: string, route: string, body?: unknown) {
  const r = await fetch(`${baseUrl}${route}`, {
    method,
    headers: { authorization: `Bearer ${token}`, ...(body ? { 'content-type': 'application/json' } : {}) },
    body: body ? JSON.stringify(body) : undefined,
  });
  const text = await r.text();
  return { status: r.status, body: text ? JSON.parse(text) : null };
}
