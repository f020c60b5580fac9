// Builds each workspace only when its sources are newer than its last build, so a second
// `npm start` goes straight to serving. `node build.mjs --force` rebuilds everything.
// Each step's own output is kept back and shown only when the step fails: a newcomer's first
// screen is one line per workspace, not the compilers' chatter.
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';

const force = process.argv.includes('--force');
const steps = [
  {
    name: 'domain',
    inputs: ['domain/src', 'domain/tsconfig.json', 'domain/tsconfig.build.json', 'domain/package.json'],
    out: 'domain/dist',
  },
  {
    name: 'worker',
    inputs: ['worker/src', 'worker/tsconfig.json', 'worker/package.json', 'domain/src'],
    out: 'worker/dist',
  },
  {
    name: 'api',
    inputs: ['api/src', 'api/tsconfig.json', 'api/package.json', 'domain/src', 'worker/src'],
    out: 'api/dist',
  },
  {
    name: 'ui',
    inputs: ['ui/src', 'ui/public', 'ui/index.html', 'ui/vite.config.ts', 'ui/package.json', 'domain/src', 'examples'],
    out: 'ui/dist',
  },
];

function newest(p) {
  if (!fs.existsSync(p)) return 0;
  const st = fs.statSync(p);
  if (!st.isDirectory()) return st.mtimeMs;
  let m = st.mtimeMs;
  for (const e of fs.readdirSync(p)) m = Math.max(m, newest(path.join(p, e)));
  return m;
}

let rebuilt = false;
for (const s of steps) {
  const stamp = path.join(s.out, '.build-stamp');
  const built = fs.existsSync(stamp) ? fs.statSync(stamp).mtimeMs : 0;
  // A rebuilt dependency makes everything after it stale too.
  if (!force && !rebuilt && built >= Math.max(...s.inputs.map(newest))) {
    console.log(`build: ${s.name} is up to date`);
    continue;
  }
  const started = Date.now();
  const run = spawnSync('npm', ['run', 'build', '--silent', '-w', s.name], {
    stdio: ['ignore', 'pipe', 'pipe'],
    encoding: 'utf8',
    maxBuffer: 64 * 1024 * 1024,
  });
  if (run.status !== 0) {
    process.stdout.write(run.stdout ?? '');
    process.stderr.write(run.stderr ?? '');
    console.error(`build: ${s.name} failed (exit ${run.status ?? run.signal})`);
    process.exit(1);
  }
  fs.mkdirSync(s.out, { recursive: true });
  fs.writeFileSync(stamp, new Date().toISOString());
  console.log(`build: ${s.name} built in ${((Date.now() - started) / 1000).toFixed(1)} s`);
  rebuilt = true;
}
