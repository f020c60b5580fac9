/**
 * Regression against version 1: tests/reference/physics/v1-outputs.json holds inputs and outputs
 * of the version-1 models (cross-field 1.0.0, parallel-balance 1.0.0, column-profile 1.0.0)
 * captured from the code as it stood before version 2, at seeded random points. With the new
 * inputs at their defaults, every version-1 output must keep its value unless the issue changed
 * its definition on purpose (listed below with the reason).
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { columnProfile } from './column-profile.js';
import { crossField } from './cross-field.js';
import { parallelBalance } from './parallel-balance.js';
import type { ModelDefinition } from './types.js';

interface Captured {
  version: string;
  points: { inputs: Record<string, number>; outputs: Record<string, number | boolean | string>; flags: string[] }[];
}
const file = new URL('../../../tests/reference/physics/v1-outputs.json', import.meta.url);
const v1 = JSON.parse(readFileSync(file, 'utf8')) as Record<string, Captured>;
const num = (v: number | boolean | string): number | boolean => (typeof v === 'string' ? Number(v) : v);

/**
 * Same value, or within tol·max(1, |expected|) for outputs whose formula was made
 * cancellation-free: there the version-1 value itself carried a rounding error of that size.
 */
function same(actual: number | boolean, expected: number | boolean, tol: number): boolean {
  if (typeof expected === 'boolean' || typeof actual === 'boolean') return actual === expected;
  if (Number.isNaN(expected)) return Number.isNaN(actual);
  if (actual === expected) return true;
  return Math.abs(actual - expected) <= tol * Math.max(1, Math.abs(expected));
}

function compare(
  model: ModelDefinition,
  captured: Captured,
  changed: Record<string, string>,
  tolerant: Record<string, number>,
  newFlags: string[],
): number {
  let compared = 0;
  for (const p of captured.points) {
    const r = model.evaluate(p.inputs);
    if (r.flags.some((f) => newFlags.includes(f))) continue;
    compared++;
    for (const [name, value] of Object.entries(p.outputs)) {
      if (name in changed) continue;
      const ok = same(num(r.outputs[name]!), num(value), tolerant[name] ?? 0);
      if (!ok)
        throw new Error(`${model.id} ${name} changed at ${JSON.stringify(p.inputs)}: ${value} → ${r.outputs[name]}`);
    }
    expect(r.flags.filter((f) => !newFlags.includes(f))).toEqual(p.flags);
  }
  return compared;
}

describe('version-1 outputs are unchanged at the default new inputs', () => {
  it('cross-field: every v1 output except the redefined ρ_s', () => {
    expect(v1['cross-field']!.version).toBe('1.0.0');
    const n = compare(
      crossField,
      v1['cross-field']!,
      // Issue 12 §1: ρ_s becomes c_s0/ω_ci (drift-wave convention); ρ_s/L_n follows it.
      { rho_s_m: 'redefined', rho_s_over_Ln: 'redefined' },
      // dB/B = −β/(1 + sqrt(1−β)): the v1 form sqrt(1−β) − 1 carried an absolute error of about ε.
      { dB_over_B: 4.5e-16 },
      ['unmagnetised_ions', 'unmagnetised_electrons', 'relativistic', 'rho_s_over_Ln'],
    );
    expect(n).toBeGreaterThan(100);
  });

  it('parallel-balance: every v1 output; deviation to the precision v1 had', () => {
    const n = compare(parallelBalance, v1['parallel-balance']!, {}, { deviation: 1e-12 }, ['overflow']);
    expect(n).toBeGreaterThan(80);
  });

  it('column-profile: integrals, axis values and orderings; peaks now include r = 2a', () => {
    const n = compare(
      columnProfile,
      v1['column-profile']!,
      {
        // Issue 12 §2: the peak window now includes r = 2a itself (v1 stopped at the last node below it).
        vDi_peak_ms: 'window edge evaluated',
        vDe_peak_ms: 'window edge evaluated',
        vE_peak_ms: 'window edge evaluated',
        r_peak_m: 'window edge evaluated',
        jTheta_peak_Am2: 'window edge evaluated',
        max_rho_i_over_Ln: 'window edge evaluated',
        max_rho_s_over_Ln: 'window edge evaluated and ρ_s redefined',
        max_lambdaD_over_Ln: 'window edge evaluated',
        max_vDi_over_vti: 'window edge evaluated',
        valid: 'new flags',
      },
      { dB_over_B_axis: 4.5e-16 },
      ['under_resolved', 'peak_at_window_edge', 'rho_s_over_Ln'],
    );
    expect(n).toBeGreaterThan(5);
  });
});
