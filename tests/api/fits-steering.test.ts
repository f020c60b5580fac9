import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO, startTestApp, type TestApp } from '../support/app.js';
import { ARGON_PROBE_TRACE as TRACE, probeTraceCsv, probeTraceIis } from '../fixtures/datasets/probe-trace.js';

let t: TestApp;
let researcher: string;
const auth = (token: string) => ({ authorization: `Bearer ${token}` });

async function upload(name: string, csv: string, units: Record<string, string>): Promise<number> {
  const res = await t.http
    .post('/api/datasets')
    .set(auth(researcher))
    .field('name', name)
    .field('units', JSON.stringify(units))
    .attach('file', Buffer.from(csv), `${name}.csv`);
  expect(res.status).toBe(201);
  return res.body.id as number;
}

let probeId: number;
let boxbodId: number;
beforeAll(async () => {
  t = await startTestApp();
  researcher = await t.login(DEMO.researcher);
  probeId = await upload('Argon probe trace', probeTraceCsv(), { V: 'V', I: 'A' });
  // NIST StRD BoxBOD (public-domain NIST data, tests/reference/strd).
  const boxbod = readFileSync(new URL('../reference/strd/BoxBOD_data.csv', import.meta.url), 'utf8');
  boxbodId = await upload('BoxBOD', boxbod, {});
}, 60_000);
afterAll(async () => {
  await t?.close();
});

const probeFit = (over: Record<string, unknown> = {}) => ({
  source: { kind: 'dataset', id: probeId },
  model: 'probe-retarding',
  y: 'I',
  x: 'V',
  probe: { area_m2: TRACE.areaM2, mu: TRACE.mu },
  ...over,
});
type Param = { name: string; value: number; stdError: number; fixed: boolean; unit: string | null };
const param = (body: { parameters: Param[] }, name: string) => body.parameters.find((p) => p.name === name)!;

describe('probe-retarding through the api', () => {
  it('gives Te, V_f, I_is and the density with uncertainties, within 3 standard errors of the invented truth', async () => {
    // The shipped example is this generator's output.
    expect(readFileSync(new URL('../../examples/datasets/argon-probe-iv.csv', import.meta.url), 'utf8')).toBe(
      probeTraceCsv(),
    );
    const res = await t.http.post('/api/fits').set(auth(researcher)).send(probeFit());
    expect(res.status).toBe(201);
    const f = res.body;
    expect(f).toMatchObject({ status: 'completed', converged: true });
    expect(f.region).toMatchObject({ vMin: TRACE.vMin, automatic: true, of: TRACE.points });
    expect(f.region.vMax).toBeLessThanOrEqual(TRACE.vfV + 5.2 * TRACE.teEv);
    expect(f.n).toBe(f.region.used);
    const te = param(f, 'Te_eV');
    expect(te.unit).toBe('eV');
    expect(param(f, 'I_is').unit).toBe('A');
    expect(param(f, 'V_f').unit).toBe('V');
    expect(Math.abs(te.value - TRACE.teEv)).toBeLessThan(3 * te.stdError);
    // Each standard error is the root of its covariance diagonal (parameter order I_is, V_f, Te_eV).
    expect(te.stdError).toBe(Math.sqrt(f.covariance[2][2]));
    expect(param(f, 'I_is').stdError).toBe(Math.sqrt(f.covariance[0][0]));
    expect(Math.abs(param(f, 'V_f').value - TRACE.vfV)).toBeLessThan(3 * param(f, 'V_f').stdError);
    expect(Math.abs(param(f, 'I_is').value - probeTraceIis())).toBeLessThan(3 * param(f, 'I_is').stdError);
    const n = f.derived.find((d: { name: string }) => d.name === 'n_m3');
    expect(n.unit).toBe('m^-3');
    expect(n.stdError).toBeGreaterThan(0);
    expect(Math.abs(n.value - TRACE.nM3)).toBeLessThan(3 * n.stdError);
    expect(f.plot.x.V).toHaveLength(f.n);
  });

  it('holds a fixed V_f (stdError 0, dof of the free parameters) and a bounded Te', async () => {
    const res = await t.http
      .post('/api/fits')
      .set(auth(researcher))
      .send(probeFit({ fixed: { V_f: -11 }, bounds: { Te_eV: [0.5, null] } }));
    expect(res.status).toBe(201);
    expect(param(res.body, 'V_f')).toMatchObject({ value: -11, stdError: 0, fixed: true });
    expect(param(res.body, 'Te_eV').fixed).toBe(false);
    expect(res.body.dof).toBe(res.body.n - 2);
    expect(res.body.correlation[1][0]).toBeNull();
  });

  it('an active bound: Te capped at 2.5 eV sits on the cap', async () => {
    const res = await t.http
      .post('/api/fits')
      .set(auth(researcher))
      .send(probeFit({ bounds: { Te_eV: [0.5, 2.5] } }));
    expect(res.status).toBe(201);
    expect(param(res.body, 'Te_eV').value).toBe(2.5);
    expect(res.body.message).toMatch(/at a bound: Te_eV/);
  });

  it('refuses bad steering with a 400 naming the field', async () => {
    const cases: [Record<string, unknown>, RegExp][] = [
      [{ bounds: { Te_eV: [5, 1] } }, /bounds/],
      [{ fixed: { Q: 1 } }, /fixed\.Q/],
      [{ fixed: { Te_eV: 3 }, bounds: { Te_eV: [1, 5] } }, /fixed/],
      [{ sigmaMode: 'absolute' }, /sigmaMode/],
      [{ probe: { area_m2: -1, mu: 40 } }, /area_m2/],
      [{ range: [5, -5] }, /range/],
      [{ normalised: true }, /normalised/],
    ];
    for (const [over, field] of cases) {
      const res = await t.http.post('/api/fits').set(auth(researcher)).send(probeFit(over));
      expect(res.status, JSON.stringify(over)).toBe(400);
      expect(JSON.stringify(res.body), JSON.stringify(over)).toMatch(field);
    }
  });
});

describe('convergence advice through the api', () => {
  it('BoxBOD from NIST start 1: not converged, suspect the start values, last iterate offered', async () => {
    const res = await t.http
      .post('/api/fits')
      .set(auth(researcher))
      .send({
        source: { kind: 'dataset', id: boxbodId },
        model: 'expression',
        expr: 'b1*(1-exp(-b2*x))',
        y: 'y',
        x: 'x',
        params: { b1: 1, b2: 1 },
      });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ status: 'failed', converged: false, advice: { suspect: 'start' } });
    expect(Object.keys(res.body.advice.lastIterate).sort()).toEqual(['b1', 'b2']);
    // Starting again from NIST start 2 converges to the certified b1 = 213.80940889 (NIST StRD).
    const again = await t.http
      .post('/api/fits')
      .set(auth(researcher))
      .send({
        source: { kind: 'dataset', id: boxbodId },
        model: 'expression',
        expr: 'b1*(1-exp(-b2*x))',
        y: 'y',
        x: 'x',
        params: { b1: 100, b2: 0.75 },
      });
    expect(again.body.converged).toBe(true);
    expect(again.body.advice).toBeUndefined();
    expect(param(again.body, 'b1').value).toBeCloseTo(213.80940889, 5);
  });
});
