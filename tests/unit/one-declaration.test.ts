/**
 * Issue 16 §3: every response shape and enum is declared once, in domain/src/contracts, and the api and
 * the ui import it. Hand copies drift silently (results pages once listed columns without the `source`
 * the sweep itself showed, and the ui typed cells as numbers while the api sends "Infinity"), so this
 * scans the sources and fails when one comes back:
 *  - an `interface X` or `type X = { … }` elsewhere whose name the contracts already export;
 *  - a role list, union or guard written out (`['admin', 'researcher']`, `'admin' | 'researcher'`,
 *    `@Roles('researcher', 'admin')`): use ROLE_NAMES, CREATOR_ROLES or RoleName;
 *  - the active states written out (`['queued', 'running']`, `'queued' | 'running'`): use ACTIVE_STATES
 *    or isActiveState.
 * tests/ is not scanned on purpose: tests such as role-matrix state the expected rules independently.
 */
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';

const ROOT = path.resolve(import.meta.dirname, '../..');
const CONTRACTS = path.join(ROOT, 'domain', 'src', 'contracts');
const SCANNED = ['ui/src', 'api/src', 'worker/src', 'domain/src'];

function sourceFiles(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true, recursive: true })
    .filter((e) => e.isFile() && /\.tsx?$/.test(e.name) && !/\.d\.ts$/.test(e.name))
    .map((e) => path.join(e.parentPath, e.name));
}

/** Every source file, spec files included: a hand copy in a test of the ui drifts just the same. */
const files = SCANNED.flatMap((d) => sourceFiles(path.join(ROOT, d))).map((f) => ({
  rel: path.relative(ROOT, f).split(path.sep).join('/'),
  text: readFileSync(f, 'utf8'),
}));

/** Where the lists are declared, and the spec that pins their values. */
const DECLARING = new Set([
  'domain/src/contracts/auth.ts',
  'domain/src/contracts/sweeps.ts',
  'domain/src/contracts/sweeps.spec.ts',
]);

function hits(pattern: RegExp, skip: (rel: string) => boolean): string[] {
  return files
    .filter(({ rel }) => !skip(rel))
    .flatMap(({ rel, text }) =>
      text.split('\n').flatMap((line, i) => (pattern.test(line) ? [`${rel}:${i + 1}: ${line.trim()}`] : [])),
    );
}
const inContracts = (rel: string) => rel.startsWith('domain/src/contracts/');
const declaring = (rel: string) => DECLARING.has(rel);

const contractNames = [
  ...new Set(
    sourceFiles(CONTRACTS)
      .filter((f) => !f.endsWith('.spec.ts'))
      .flatMap((f) => [...readFileSync(f, 'utf8').matchAll(/^export (?:interface|type) (\w+)/gm)].map((m) => m[1]!)),
  ),
];

const ROLE = `'(?:admin|researcher|reviewer)'`;
const ROLE_LIST = new RegExp(`\\[\\s*${ROLE}\\s*,\\s*${ROLE}`);
const ROLE_UNION = new RegExp(`${ROLE}\\s*\\|\\s*${ROLE}`);
/** A route guard listing several roles by hand (`@Roles('researcher', 'admin')`). */
const ROLE_ARGS = new RegExp(`Roles\\(\\s*${ROLE}\\s*,\\s*${ROLE}`);
const ACTIVE_LIST = /\[\s*'queued'\s*,\s*'running'\s*\]|'queued'\s*\|\s*'running'/;
/** An alias (`type FitCreated = FitCreatedView`) or a re-export is fine; a body is a copy. */
const names = contractNames.join('|');
const REDECLARED = new RegExp(`\\b(?:interface\\s+(?:${names})\\b|type\\s+(?:${names})\\s*=\\s*\\{)`);

describe('one declaration per response shape and enum', () => {
  it('finds the contracts it guards (so an empty scan cannot pass)', () => {
    expect(contractNames).toEqual(expect.arrayContaining(['SweepView', 'SweepColumnView', 'ResultsPage', 'FitView']));
    expect(files.some((f) => f.rel === 'ui/src/api/sweeps.ts')).toBe(true);
    expect(files.some((f) => f.rel === 'domain/src/contracts/sweeps.ts')).toBe(true);
  });

  it('no interface or object type outside the contracts redeclares a contract by name', () => {
    expect(hits(REDECLARED, inContracts)).toEqual([]);
  });

  it('no role list or role union is written out', () => {
    expect(hits(ROLE_LIST, declaring)).toEqual([]);
    expect(hits(ROLE_UNION, declaring)).toEqual([]);
    expect(hits(ROLE_ARGS, declaring)).toEqual([]);
  });

  it('the active states are not written out', () => {
    expect(hits(ACTIVE_LIST, declaring)).toEqual([]);
  });

  it('the patterns catch the copies they are meant to catch, and not their uses', () => {
    expect(REDECLARED.test('export interface SweepView {')).toBe(true);
    expect(REDECLARED.test('type ResultsPage = { rows: unknown[] };')).toBe(true);
    expect(REDECLARED.test('export type FitCreated = FitCreatedView;')).toBe(false);
    expect(REDECLARED.test('interface SweepViewProps {')).toBe(false);
    expect(ROLE_LIST.test(`hasRole(me, ['admin', 'researcher'])`)).toBe(true);
    expect(ROLE_LIST.test(`roles: ['researcher', 'reviewer', 'admin'],`)).toBe(true);
    expect(ROLE_LIST.test(`roles: ['admin'],`)).toBe(false);
    expect(ROLE_UNION.test(`type Role = 'admin' | 'researcher' | 'reviewer';`)).toBe(true);
    expect(ROLE_ARGS.test(`@Roles('researcher', 'admin')`)).toBe(true);
    expect(ROLE_ARGS.test(`@Roles(...CREATOR_ROLES)`)).toBe(false);
    expect(ROLE_ARGS.test(`@Roles('admin')`)).toBe(false);
    expect(ACTIVE_LIST.test(`if (!['queued', 'running'].includes(s.status))`)).toBe(true);
    expect(ACTIVE_LIST.test(`status: 'queued' | 'running' | 'done'`)).toBe(true);
  });
});
