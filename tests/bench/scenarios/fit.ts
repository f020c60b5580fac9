/**
 * Scenario 6: a power-law fit with three exponents. (a) fitModel from domain/dist on generated
 * data, |v_Di| ∝ Ti/(B·Ln) with 1 % multiplicative noise from a fixed congruential sequence;
 * (b) POST /api/fits on a Te × B × Ln grid sweep (vDe ∝ Te/(B·Ln)) when the route exists.
 */
import { fitModel } from '@driftgrid/domain';
import { apiJson } from '../../support/processes.js';
import { runSweep } from '../lib/api.js';
import type { BenchConfig } from '../lib/config.js';
import { fitGrid } from '../lib/definitions.js';
import type { Report } from '../lib/report.js';
import { median } from '../lib/stats.js';
import type { KeptSweep } from './sweep-embedded.js';

function powerLawData(n: number) {
  let state = 20240611;
  const uniform = () => (state = (state * 1103515245 + 12345) % 2147483648) / 2147483648;
  const Ti = new Float64Array(n);
  const B = new Float64Array(n);
  const Ln = new Float64Array(n);
  const y = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    Ti[i] = 0.5 + 50 * uniform();
    B[i] = 0.02 + uniform();
    Ln[i] = 0.005 + 0.1 * uniform();
    y[i] = (Ti[i]! / (B[i]! * Ln[i]!)) * (1 + 0.01 * (uniform() - 0.5));
  }
  return { Ti, B, Ln, y };
}

const exps = (params: { name: string; value: number }[]) =>
  params
    .filter((p) => p.name.startsWith('exp_'))
    .map((p) => `${p.name.slice(4)} ${p.value.toFixed(3)}`)
    .join(', ');

export function benchFitDomain(cfg: BenchConfig, report: Report): void {
  const n = cfg.fitPoints;
  console.log(`\n[6] power-law fit, ${n.toLocaleString('en-US')} points`);
  const d = powerLawData(n);
  const ms: number[] = [];
  let last: ReturnType<typeof fitModel> | undefined;
  for (let r = 0; r <= cfg.fitRuns; r++) {
    const t0 = performance.now();
    last = fitModel({
      model: 'power-law',
      x: { Ti_eV: d.Ti, B_T: d.B, Ln_m: d.Ln },
      xNames: ['Ti_eV', 'B_T', 'Ln_m'],
      y: d.y,
    });
    if (r > 0) ms.push(performance.now() - t0); // run 0 warms the JIT
  }
  if (!last!.converged) throw new Error(`bench fit did not converge: ${last!.message}`);
  report.target(
    {
      scenario: '6 fit',
      metric: `fitModel power-law, 3 exponents, ${n.toLocaleString('en-US')} pts (domain)`,
      value: median(ms) / 1000,
      unit: 's',
      note: `${last!.iterations} iterations; exponents ${exps(last!.parameters)} (true 1, −1, −1)`,
    },
    '≤',
    1,
    '1 s',
  );
  report.detail('fitDomain', { n, ms, iterations: last!.iterations, parameters: last!.parameters, r2: last!.r2 });
}

export async function benchFitApi(cfg: BenchConfig, kept: KeptSweep, report: Report): Promise<void> {
  const { api } = kept;
  const scenario = '6 fit';
  const probe = await apiJson(api.baseUrl, api.token, 'POST', '/api/fits', {});
  if (probe.status === 404 || probe.status === 405) {
    report.add({ scenario, metric: 'POST /api/fits', value: 'not available', unit: '', note: `HTTP ${probe.status}` });
    report.detail('fitApi', { available: false, status: probe.status });
    return;
  }
  const source = await runSweep(api, fitGrid(cfg.fitPoints));
  const body = {
    source: { kind: 'sweep', id: source.id },
    model: 'power-law',
    y: 'vDe_ms',
    x: ['Te_eV', 'B_T', 'Ln_m'],
  };
  const ms: number[] = [];
  // eslint-disable-next-line @typescript-eslint/no-explicit-any -- the fit answer body, printed only
  let last: any;
  for (let r = 0; r < Math.max(1, cfg.fitRuns); r++) {
    const t0 = performance.now();
    const res = await apiJson(api.baseUrl, api.token, 'POST', '/api/fits', body);
    ms.push(performance.now() - t0);
    if (res.status !== 200 && res.status !== 201) {
      report.add({
        scenario,
        metric: `POST /api/fits power-law, ${source.points.toLocaleString('en-US')} pts`,
        value: `error ${res.status}`,
        unit: '',
        note: String(res.body?.message ?? '').slice(0, 160),
      });
      report.detail('fitApi', { available: true, status: res.status, body: res.body });
      return;
    }
    last = res.body;
  }
  report.target(
    {
      scenario,
      metric: `POST /api/fits power-law, 3 exponents, ${source.points.toLocaleString('en-US')} pts (api)`,
      value: median(ms) / 1000,
      unit: 's',
      note: `n=${last?.n}, ${last?.iterations} iterations; exponents ${exps(last?.parameters ?? [])}`,
    },
    '≤',
    1,
    '1 s',
  );
  report.detail('fitApi', {
    available: true,
    points: source.points,
    ms,
    result: { n: last?.n, parameters: last?.parameters, iterations: last?.iterations },
  });
}
