import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { fitModel } from './fit-model.js';
import type { FitResult } from './types.js';

/**
 * NIST Statistical Reference Datasets (StRD), Nonlinear Regression — certified parameters,
 * standard deviations and residual sums of squares, computed by NIST in extended precision.
 * Files copied to tests/reference/strd/ (see the README there for the source).
 * LRE = −log10(|estimate − certified| / |certified|), the measure StRD results are reported in.
 */
const dir = new URL('../../../tests/reference/strd/', import.meta.url);

// The NIST model formulas, written as mathjs expressions (`**` → `^`, `exp[…]` → `exp(…)`).
const MODELS: Record<string, string> = {
  DanWood: 'b1*x^b2',
  Misra1a: 'b1*(1-exp(-b2*x))',
  Misra1b: 'b1 * (1-(1+b2*x/2)^(-2))',
  Misra1c: 'b1 * (1-(1+2*b2*x)^(-.5))',
  Misra1d: 'b1*b2*x*((1+b2*x)^(-1))',
  BoxBOD: 'b1*(1-exp(-b2*x))',
  Eckerle4: '(b1/b2) * exp(-0.5*((x-b3)/b2)^2)',
  Chwirut2: 'exp(-b1*x)/(b2+b3*x)',
  Chwirut1: 'exp(-b1*x)/(b2+b3*x)',
  Rat42: 'b1 / (1+exp(b2-b3*x))',
  Rat43: 'b1 / ((1+exp(b2-b3*x))^(1/b4))',
  Bennett5: 'b1 * (b2+x)^(-1/b3)',
  MGH09: 'b1*(x^2+x*b2) / (x^2+x*b3+b4)',
  Thurber: '(b1 + b2*x + b3*x^2 + b4*x^3) / (1 + b5*x + b6*x^2 + b7*x^3)',
  MGH10: 'b1 * exp(b2/(x+b3))',
  Lanczos1: 'b1*exp(-b2*x) + b3*exp(-b4*x) + b5*exp(-b6*x)',
  Lanczos2: 'b1*exp(-b2*x) + b3*exp(-b4*x) + b5*exp(-b6*x)',
  Lanczos3: 'b1*exp(-b2*x) + b3*exp(-b4*x) + b5*exp(-b6*x)',
  Roszman1: 'b1 - b2*x - atan(b3/(x-b4))/pi',
  // Two predictors; NIST's response is log[y] (natural log), so the fit is to ln y.
  Nelson: 'b1 - b2*x1 * exp(-b3*x2)',
  Kirby2: '(b1 + b2*x + b3*x^2) / (1 + b4*x + b5*x^2)',
  Hahn1: '(b1 + b2*x + b3*x^2 + b4*x^3) / (1 + b5*x + b6*x^2 + b7*x^3)',
  ENSO: 'b1 + b2*cos(2*pi*x/12) + b3*sin(2*pi*x/12) + b5*cos(2*pi*x/b4) + b6*sin(2*pi*x/b4) + b8*cos(2*pi*x/b7) + b9*sin(2*pi*x/b7)',
};

/**
 * The data of one set as fit columns: one predictor `x`, or `x1`, `x2` for Nelson, whose certified model
 * is for ln y.
 */
function loadData(name: string): { x: Record<string, number[]>; xNames: string[]; y: number[] } {
  const rows = csv(`${name}_data.csv`).map((r) => r.map(Number));
  if (name === 'Nelson') {
    return {
      x: { x1: rows.map((r) => r[0]!), x2: rows.map((r) => r[1]!) },
      xNames: ['x1', 'x2'],
      y: rows.map((r) => Math.log(r[2]!)),
    };
  }
  return { x: { x: rows.map((r) => r[0]!) }, xNames: ['x'], y: rows.map((r) => r[1]!) };
}

/**
 * The 27 datasets of the StRD nonlinear-regression suite (NIST). Not yet copied here, because no verbatim
 * copy with certified values was at hand when the suite was extended: MGH17, Gauss1, Gauss2, Gauss3. The test below keeps that list honest.
 */
const NOT_YET_COPIED = ['MGH17', 'Gauss1', 'Gauss2', 'Gauss3'];

interface Certified {
  name: string;
  difficulty: string;
  rss: number;
  residualSd: number;
  params: { name: string; start1: number; start2: number; value: number; sd: number }[];
}

function csv(file: string): string[][] {
  return readFileSync(new URL(file, dir), 'utf8')
    .trim()
    .split(/\r?\n/)
    .slice(1)
    .map((line) => line.split(','));
}

function loadCertified(): Certified[] {
  const byName = new Map<string, Certified>();
  for (const row of csv('certified_summary.csv')) {
    // dataset,nist_difficulty,model,n_obs,dof,residual_sum_of_squares,residual_std_dev,param,start1,start2,certified_value,certified_std_dev
    const [name, difficulty, , , , rss, rsd, param, s1, s2, value, sd] = row as [string, string, ...string[]];
    let entry = byName.get(name);
    if (!entry) {
      entry = { name, difficulty, rss: Number(rss), residualSd: Number(rsd), params: [] };
      byName.set(name, entry);
    }
    const num = (t: string | undefined) => (t === undefined || t === '' ? NaN : Number(t)); // empty: not given
    entry.params.push({ name: param!, start1: num(s1), start2: num(s2), value: Number(value), sd: Number(sd) });
  }
  return [...byName.values()];
}

const byName = (r: FitResult, name: string) => r.parameters.find((q) => q.name === name)!;

function lre(estimate: number, certified: number): number {
  const rel = Math.abs(estimate - certified) / Math.abs(certified);
  return rel === 0 ? 15 : Math.min(15, -Math.log10(rel));
}

const datasets = loadCertified();
const table: Record<string, unknown>[] = [];

describe('NIST StRD nonlinear regression (source: NIST ITL Statistical Reference Datasets)', () => {
  it('covers every dataset in the reference folder (23 of the 27; the rest listed as not yet copied)', () => {
    expect(datasets.map((d) => d.name).sort()).toEqual(Object.keys(MODELS).sort());
    expect(datasets).toHaveLength(23);
    expect(datasets.length + NOT_YET_COPIED.length).toBe(27);
  });

  // Copy check: the sum of squares at the certified parameters reproduces the certified RSS.
  for (const cert of datasets) {
    it(`${cert.name}: the copied data reproduce the certified RSS at the certified parameters`, () => {
      const { x, xNames, y } = loadData(cert.name);
      const fixed = Object.fromEntries(cert.params.slice(1).map((p) => [p.name, p.value]));
      const first = cert.params[0]!;
      // All but b1 held at their certified values; b1 barely moves if the data are right.
      const r = fitModel({
        model: 'expression',
        expr: MODELS[cert.name]!,
        x,
        xNames,
        y,
        params: { [first.name]: first.value },
        fixed,
      });
      expect(lre(byName(r, first.name).value, first.value)).toBeGreaterThanOrEqual(cert.rss < 1e-20 ? 8 : 6);
      if (cert.rss > 1e-20) expect(lre(r.rss, cert.rss)).toBeGreaterThanOrEqual(6);
    });
  }

  for (const cert of datasets) {
    for (const start of [1, 2] as const) {
      // ENSO's NIST start 1 is not in the source it was copied from (only start 2 is); left out rather than guessed.
      const unknownStart = cert.params.some((p) => Number.isNaN(start === 1 ? p.start1 : p.start2));
      it.skipIf(unknownStart)(`${cert.name} (${cert.difficulty} difficulty) from NIST start ${start}`, () => {
        const { x, xNames, y } = loadData(cert.name);
        const params = Object.fromEntries(cert.params.map((p) => [p.name, start === 1 ? p.start1 : p.start2]));
        const result: FitResult = fitModel({
          model: 'expression',
          expr: MODELS[cert.name]!,
          x,
          xNames,
          y,
          params,
        });
        const paramLre = cert.params.map((p) => lre(result.parameters.find((q) => q.name === p.name)!.value, p.value));
        const sdLre = cert.params.map((p) => lre(result.parameters.find((q) => q.name === p.name)!.stdError, p.sd));
        const rssLre = lre(result.rss, cert.rss);
        table.push({
          dataset: cert.name,
          start,
          converged: result.converged,
          its: result.iterations,
          minLreParam: Math.min(...paramLre).toFixed(1),
          minLreSd: Math.min(...sdLre).toFixed(1),
          lreRss: rssLre.toFixed(1),
        });
        if (!result.converged) {
          // Only a higher-difficulty dataset from the far start 1 may fail, and then it must say so.
          expect(cert.difficulty, result.message).toBe('Higher');
          expect(start).toBe(1);
          expect(result.message).toMatch(/not converged/);
          return;
        }
        // A result marked converged must be right: ≥ 5 digits for parameters, ≥ 3 for SDs (NIST certified).
        expect(
          Math.min(...paramLre),
          `parameter LREs ${paramLre.map((v) => v.toFixed(1)).join(',')}`,
        ).toBeGreaterThanOrEqual(5);
        if (cert.name === 'Lanczos1') {
          // Data generated to 14 digits: residuals of 1e-13 are rounding in double precision, so the certified
          // SDs (from extended precision) cannot be reproduced; the engine must withhold them and say so.
          expect(result.parameters.every((p) => Number.isNaN(p.stdError))).toBe(true);
          expect(result.message).toMatch(/rounding level/);
          return;
        }
        expect(Math.min(...sdLre), `SD LREs ${sdLre.map((v) => v.toFixed(1)).join(',')}`).toBeGreaterThanOrEqual(3);
        // Certified residual sum of squares and residual standard deviation (NIST).
        expect(rssLre).toBeGreaterThanOrEqual(6);
        expect(lre(result.residualSd, cert.residualSd)).toBeGreaterThanOrEqual(6);
        expect(result.dof).toBe(y.length - cert.params.length);
      });
    }
  }

  it('prints the LRE table', () => {
    console.table(table);
    expect(table.length).toBe(45);
  });
});
