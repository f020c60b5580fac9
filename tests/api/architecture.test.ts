import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative, sep } from 'node:path';
import { describe, expect, it } from 'vitest';

// Source rules of the api (DEVELOPERS.md, Conventions): scanned as text, so a violation anywhere in
// api/src fails here with its file and line, before any reviewer has to spot it.

const root = process.cwd();

function sources(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    if (statSync(path).isDirectory()) return sources(path);
    return /\.tsx?$/.test(name) && !/\.(spec|test)\.tsx?$/.test(name) ? [path] : [];
  });
}

/** Repository-relative path with forward slashes (the allow-lists below are written that way). */
const rel = (path: string) => relative(root, path).split(sep).join('/');

interface Rule {
  what: string;
  pattern: RegExp;
  /** Files where the pattern is the point (its one declaration or its home). */
  allowed: (file: string) => boolean;
  /** A line the rule must catch: proves the pattern can fail. */
  sample: string;
}

const RULES: Rule[] = [
  {
    // A global provider hides a module's dependencies: each module imports the modules whose providers
    // it injects, so the module graph says what depends on what. Only the validated config and the one
    // database connection are needed by nearly every module, and stay global.
    what: '@Global() outside the config and database modules',
    pattern: /@Global\(\s*\)/,
    allowed: (f) => f === 'api/src/config/config.module.ts' || f === 'api/src/db/db.module.ts',
    sample: '@Global()',
  },
  {
    // SQL lives in repositories (*.repository.ts) and the database wiring (api/src/db/): services keep
    // the logic and can be read without SQL, and every statement can be found in one kind of file.
    what: 'raw SQL access (prepare(), the better-sqlite3 connection) outside a repository',
    pattern: /\.prepare\(|\bsqlite\.|\$client\./,
    allowed: (f) => f.endsWith('.repository.ts') || f.startsWith('api/src/db/'),
    sample: "this.handle.sqlite.prepare('select 1').get();",
  },
  {
    // One way to open a transaction: inTransaction(sqlite, fn) in repositories, Transactions.run(fn) in
    // services (api/src/db/transactions.ts). Other spellings (sqlite.transaction(fn)(), repo.transaction)
    // drifted apart before, and a service should not need the connection just to open one.
    what: '.transaction( outside the transaction helper',
    pattern: /\.transaction\(/,
    allowed: (f) => f === 'api/src/db/transactions.ts',
    sample: 'const run = this.handle.sqlite.transaction(() => {',
  },
  {
    // The active states are ACTIVE_STATES in @driftgrid/domain; a literal copy in SQL or a list goes
    // stale the day a state is added. SQL binds the list as placeholders instead.
    what: "a literal list of the active states (IN ('queued', …) or ['queued', 'running'])",
    pattern: /\bIN\s*\(\s*'(queued|running)'|\[\s*'queued'\s*,\s*'running'\s*\]/i,
    allowed: () => false,
    sample: "COALESCE(SUM(CASE WHEN status IN ('queued', 'running') THEN 1 ELSE 0 END), 0)",
  },
  {
    // Route rules name roles through the domain's lists (ROLE_NAMES, CREATOR_ROLES): a route written
    // @Roles('researcher', 'admin') keeps its old set when the product's notion of a creator changes.
    // A single role (@Roles('admin')) is a fact of that route and stays literal.
    what: 'a written-out list of several roles in @Roles(…)',
    pattern: /Roles\(\s*'(admin|researcher|reviewer)'\s*,/,
    allowed: () => false,
    sample: "@Roles('researcher', 'admin')",
  },
];

describe('api source rules', () => {
  const files = sources(join(root, 'api', 'src')).map((path) => ({
    file: rel(path),
    text: readFileSync(path, 'utf8'),
  }));

  it('scans the api sources (modules, services, repositories)', () => {
    const names = files.map((f) => f.file);
    expect(names).toContain('api/src/app.module.ts');
    expect(names).toContain('api/src/db/db.module.ts');
    expect(names.some((n) => n.endsWith('.repository.ts'))).toBe(true);
    expect(names.some((n) => n.endsWith('.service.ts'))).toBe(true);
  });

  it.each(RULES.map((r) => [r.what, r] as const))('each rule catches its own example: %s', (_, rule) => {
    expect(rule.pattern.test(rule.sample)).toBe(true);
  });

  it.each(RULES.map((r) => [r.what, r] as const))('no %s', (_, rule) => {
    const found: string[] = [];
    for (const { file, text } of files) {
      if (rule.allowed(file)) continue;
      text.split('\n').forEach((line, i) => {
        if (rule.pattern.test(line)) found.push(`${file}:${i + 1}: ${line.trim()}`);
      });
    }
    expect(found).toEqual([]);
  });

  it('the allowed @Global() modules are exactly config and database', () => {
    const globals = files.filter((f) => /@Global\(\s*\)/.test(f.text)).map((f) => f.file);
    expect(globals.sort()).toEqual(['api/src/config/config.module.ts', 'api/src/db/db.module.ts']);
  });
});
