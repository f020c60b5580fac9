import { describe, expect, it } from 'vitest';
import { getModel } from '../models/registry.js';
import type { ModelDefinition } from '../models/types.js';
import { COLUMN_GROUPS, columnGroup, outputGroup } from './columns.js';
import { regimeBoundaries } from './regimes.js';
import { evenlySpread } from './selection.js';

describe('regimeBoundaries', () => {
  it('finds every cross-field flag with an ordering parameter and threshold, at the default levels', () => {
    const b = regimeBoundaries(getModel('cross-field'));
    const byFlag = Object.fromEntries(b.map((x) => [x.flag, x]));
    // ρ_i/L_n ≥ 0.1 and λ_D/L_n ≥ 0.1 are the model's defaults (0.1: common practice for "≪ 1").
    expect(byFlag.rho_i_over_Ln).toMatchObject({ output: 'rho_i_over_Ln', level: 0.1, below: false });
    expect(byFlag.lambdaD_over_Ln).toMatchObject({ output: 'lambdaD_over_Ln', level: 0.1 });
    expect(byFlag.beta).toMatchObject({ output: 'beta', level: 1 });
    // Every flag of the model that has both an output and a threshold is covered.
    const m = getModel('cross-field');
    for (const f of m.flags)
      if (m.outputs.some((o) => o.name === f.code) && m.thresholds.some((t) => t.name === `${f.code}_max`))
        expect(byFlag[f.code]).toBeDefined();
  });

  it('draws the magnetisation and relativistic boundaries through their ordering parameters', () => {
    const b = regimeBoundaries(getModel('cross-field'));
    const byFlag = Object.fromEntries(b.map((x) => [x.flag, x]));
    // Unmagnetised when ν/ω_c ≥ 1 (collision and gyration rates equal), relativistic when v/c ≥ 0.1.
    expect(byFlag.unmagnetised_ions).toMatchObject({ output: 'nu_over_omega_i', threshold: 'nu_over_omega_i_max' });
    expect(byFlag.unmagnetised_electrons).toMatchObject({ output: 'nu_over_omega_e' });
    expect(byFlag.relativistic).toMatchObject({ output: 'v_over_c', level: 0.1 });
    expect(byFlag.rho_s_over_Ln).toMatchObject({ output: 'rho_s_over_Ln' });
    // Every flag of cross-field has an ordering parameter and a threshold.
    expect(b.map((x) => x.flag).sort()).toEqual(
      getModel('cross-field')
        .flags.map((f) => f.code)
        .sort(),
    );
  });

  it("uses the sweep's threshold override", () => {
    const b = regimeBoundaries(getModel('cross-field'), { rho_i_over_Ln_max: 0.3 });
    expect(b.find((x) => x.flag === 'rho_i_over_Ln')?.level).toBe(0.3);
  });

  it('follows explicit ordering metadata where the output is named differently (column-profile)', () => {
    const b = regimeBoundaries(getModel('column-profile'));
    expect(b.find((x) => x.flag === 'rho_i_over_Ln')?.output).toBe('max_rho_i_over_Ln');
    expect(b.find((x) => x.flag === 'beta')?.output).toBe('beta0');
  });

  it('skips flags without a threshold and honours below-threshold orderings', () => {
    const base = getModel('cross-field');
    const m: ModelDefinition = {
      ...base,
      flags: [
        ...base.flags,
        { code: 'cutoff', bit: 9, invalidates: true, meaning: 'solver cut-off' },
        {
          code: 'beta',
          bit: 10,
          invalidates: false,
          meaning: 'low beta',
          ordering: { output: 'beta', threshold: 'beta_lo', below: true },
        },
      ],
      thresholds: [...base.thresholds, { name: 'beta_lo', default: 1e-4, meaning: 'low' }],
    };
    const b = regimeBoundaries(m);
    expect(b.some((x) => x.flag === 'cutoff')).toBe(false);
    expect(b.find((x) => x.threshold === 'beta_lo')).toMatchObject({ below: true, level: 1e-4, invalidates: false });
  });
});

describe('column groups', () => {
  it('puts cross-field outputs in the groups a physicist expects', () => {
    const m = getModel('cross-field');
    const g = (name: string) => outputGroup(m.outputs.find((o) => o.name === name)!);
    expect(g('vE_ms')).toBe('drifts');
    expect(g('vDi_ms')).toBe('drifts');
    // Thermal and sound speeds are scales of the plasma, not drifts.
    expect(g('vti_ms')).toBe('scales');
    expect(g('cs_ms')).toBe('scales');
    expect(g('rho_i_m')).toBe('scales');
    expect(g('omega_ci')).toBe('scales');
    expect(g('rho_i_over_Ln')).toBe('orderings');
    expect(g('valid')).toBe('flags');
    expect(g('jTheta_Am2')).toBe('other');
    // The collision rates and the collisional drifts form their own group, so the default table keeps to the
    // collisionless drifts and orderings (and fits 1440 px); the magnetisation ratios stay orderings.
    for (const name of ['nu_in_s', 'lnLambda_ei', 'vTheta_i_ms', 'vr_e_ms', 'D_Bohm_m2s'])
      expect(g(name)).toBe('collisions');
    expect(g('nu_over_omega_i')).toBe('orderings');
    expect(m.outputs.filter((o) => outputGroup(o) === 'drifts').map((o) => o.name)).not.toContain('vTheta_e_ms');
  });

  it('groups stored columns: swept inputs, outputs, derived, flags; fixed inputs and the index have none', () => {
    const m = getModel('cross-field');
    expect(columnGroup({ name: 'Te_eV', kind: 'input' }, m, ['Te_eV'])).toBe('swept');
    expect(columnGroup({ name: 'n_m3', kind: 'input' }, m, ['Te_eV'])).toBeNull();
    expect(columnGroup({ name: 'idx', kind: 'index' }, m, [])).toBeNull();
    expect(columnGroup({ name: 'flags', kind: 'flags' }, m, [])).toBe('flags');
    expect(columnGroup({ name: 'ratio', kind: 'derived' }, m, [])).toBe('derived');
    expect(COLUMN_GROUPS[0]).toBe('swept');
  });
});

describe('evenlySpread', () => {
  it('keeps every value when there are few', () => {
    expect(evenlySpread(5, 8)).toEqual([0, 1, 2, 3, 4]);
  });
  it('spreads up to max values evenly with both ends', () => {
    const p = evenlySpread(30, 8);
    expect(p).toHaveLength(8);
    expect(p[0]).toBe(0);
    expect(p.at(-1)).toBe(29);
    const gaps = p.slice(1).map((v, i) => v - p[i]!);
    expect(Math.max(...gaps) - Math.min(...gaps)).toBeLessThanOrEqual(1);
  });
  it('handles one value and zero', () => {
    expect(evenlySpread(10, 1)).toEqual([0]);
    expect(evenlySpread(0, 8)).toEqual([]);
  });
});
