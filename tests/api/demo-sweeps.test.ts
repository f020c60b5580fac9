/**
 * The demo seed step: every examples/*.json definition is valid, small, and completes when
 * submitted as the demo researcher through SweepsService.create. Point counts are recomputed
 * here from the axis counts (grid: product of counts; random designs: `samples`; Saltelli: samples·(d + 2)).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readExampleDefinitions, seedDemoSweeps } from '../../api/src/seed/demo-sweeps.js';
import { DEMO, startTestApp, type TestApp } from '../support/app.js';
import { waitForSweep } from '../support/sweeps.js';

interface Def {
  name: string;
  axes: { kind: string; count?: number; values?: unknown[] }[];
  sampling?: { kind: string; samples?: number };
}

function expectedPoints(d: Def): number {
  // Saltelli: N sample groups of d + 2 points (A, B and one A_B^(i) per axis; Saltelli et al. 2010).
  if (d.sampling?.kind === 'saltelli') return d.sampling.samples! * (d.axes.length + 2);
  if (d.sampling && d.sampling.kind !== 'grid') return d.sampling.samples!;
  return d.axes.reduce((p, a) => p * (a.kind === 'list' ? a.values!.length : a.count!), 1);
}

describe('demo sweeps from examples/', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await startTestApp();
  });
  afterAll(async () => {
    await t?.close();
  });

  it('holds several definitions, each at most ~20,000 points, including the SPEC §4 deuterium scan', () => {
    const examples = readExampleDefinitions();
    expect(examples.length).toBeGreaterThanOrEqual(4);
    for (const { definition } of examples) expect(expectedPoints(definition as Def)).toBeLessThanOrEqual(20_000);
    const edge = examples.find((e) => (e.definition as Def).name === 'Edge drift scan, deuterium');
    expect(expectedPoints(edge!.definition as Def)).toBe(31 * 50 * 3 * 3);
  });

  it('submits them as the demo researcher and every one completes with the expected points', async () => {
    const ids = await seedDemoSweeps(t.app);
    const examples = readExampleDefinitions();
    expect(ids).toHaveLength(examples.length);
    const token = await t.login(DEMO.researcher);
    for (const [k, id] of ids.entries()) {
      const sweep = await waitForSweep(t, token, id, 120_000);
      const def = examples[k]!.definition as Def;
      expect(sweep.status, def.name).toBe('completed');
      expect(sweep.name).toBe(def.name);
      expect(sweep.points).toBe(expectedPoints(def));
      expect(sweep.progress).toMatchObject({ done: sweep.points, total: sweep.points });
    }
  });
});
