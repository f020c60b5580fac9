import { describe, expect, it } from 'vitest';
import { NotFoundError, ValidationError } from '../errors.js';
import { allocateChunk, getModel, listModelSummaries, models } from './registry.js';
import { checkInputValue, resolveInputs, resolveThresholds } from './validate.js';

describe('model registry', () => {
  it('lists the three models with complete metadata', () => {
    expect(models.map((m) => m.id)).toEqual(['cross-field', 'parallel-balance', 'column-profile']);
    for (const m of models) {
      expect(m.version).toMatch(/^\d+\.\d+\.\d+$/);
      const names = new Set<string>();
      for (const i of m.inputs) {
        expect(i.meaning.length).toBeGreaterThan(5);
        expect(Number.isFinite(i.min) && Number.isFinite(i.max)).toBe(true);
        expect(checkInputValue(i, i.default)).toBeNull();
        names.add(i.name);
      }
      for (const o of m.outputs) {
        expect(names.has(o.name)).toBe(false);
        expect(o.meaning.length).toBeGreaterThan(5);
        names.add(o.name);
      }
      expect(m.outputs.some((o) => o.name === 'valid' && o.kind === 'boolean')).toBe(true);
      expect(new Set(m.flags.map((f) => f.bit)).size).toBe(m.flags.length);
    }
  });

  it('getModel throws NotFoundError naming the id and the known ids', () => {
    expect(getModel('cross-field').id).toBe('cross-field');
    expect(() => getModel('warp-drive')).toThrow(NotFoundError);
    expect(() => getModel('warp-drive')).toThrow(/warp-drive.*cross-field, parallel-balance, column-profile/);
  });

  it('summaries are JSON-safe and round-trip', () => {
    const s = listModelSummaries();
    expect(JSON.parse(JSON.stringify(s))).toEqual(s);
    expect(s.find((m) => m.id === 'column-profile')!.hasProfile).toBe(true);
    expect(s.find((m) => m.id === 'cross-field')!.thresholds.map((t) => [t.name, t.default])).toEqual([
      ['rho_i_over_Ln_max', 0.1],
      ['lambdaD_over_Ln_max', 0.1],
      ['beta_max', 1],
      ['nu_over_omega_i_max', 1],
      ['nu_over_omega_e_max', 1],
      ['v_over_c_max', 0.1],
      ['rho_s_over_Ln_max', 0.1],
    ]);
  });

  it('allocateChunk gives one column per output and a flag array', () => {
    const m = getModel('parallel-balance');
    const c = allocateChunk(m, 7);
    expect(Object.keys(c.columns)).toEqual(m.outputs.map((o) => o.name));
    expect(c.columns.valid).toHaveLength(7);
    expect(c.flags).toBeInstanceOf(Uint32Array);
  });
});

describe('resolveInputs', () => {
  const cf = getModel('cross-field');

  it('fills defaults and parses unit strings', () => {
    const v = resolveInputs(cf, { Te_eV: '10 eV', B_T: '5000 G', Ln_m: '2 cm', n_m3: '1e13 cm^-3', Er_Vm: '-2 kV/m' });
    expect(v).toMatchObject({ Te_eV: 10, B_T: 0.5, Ln_m: 0.02, n_m3: 1e19, Er_Vm: -2000, mu: 2, Z: 1, gamma_e: 1 });
    expect(Object.keys(v).sort()).toEqual(cf.inputs.map((i) => i.name).sort());
  });

  it('rejects non-physical and unknown values, listing every bad field', () => {
    let err: ValidationError | undefined;
    try {
      resolveInputs(cf, {
        Te_eV: 0,
        B_T: 0,
        n_m3: -1,
        Z: 0.5,
        gamma_e: 0,
        Ti_eV: Number.NaN,
        Ln_m: Infinity,
        mu: '2 m',
        bogus: 1,
        Er_Vm: null,
      });
    } catch (e) {
      err = e as ValidationError;
    }
    expect(err).toBeInstanceOf(ValidationError);
    const byPath = Object.fromEntries(err!.details!.map((d) => [d.path, d.message]));
    expect(Object.keys(byPath).sort()).toEqual(
      [
        'inputs.B_T',
        'inputs.Er_Vm',
        'inputs.Ln_m',
        'inputs.Te_eV',
        'inputs.Ti_eV',
        'inputs.Z',
        'inputs.bogus',
        'inputs.gamma_e',
        'inputs.mu',
        'inputs.n_m3',
      ].sort(),
    );
    expect(byPath['inputs.Te_eV']).toBe('Te_eV must be > 0 and ≤ 1e6 eV; got 0 eV');
    expect(byPath['inputs.B_T']).toMatch(/> 0 and ≤ 100 T/);
    expect(byPath['inputs.Z']).toMatch(/≥ 1 and ≤ 100/);
    expect(byPath['inputs.Ti_eV']).toMatch(/must be a number/);
    expect(byPath['inputs.Ln_m']).toMatch(/finite/);
    expect(byPath['inputs.bogus']).toMatch(/unknown input "bogus".*Te_eV/);
  });

  it('checks whole numbers and thresholds', () => {
    const cp = getModel('column-profile');
    expect(() => resolveInputs(cp, { nr: 100.5 })).toThrow(/whole number/);
    expect(resolveInputs(cp, { nr: '512' }).nr).toBe(512);
    expect(resolveThresholds(cf, { beta_max: 0.5 })).toEqual({
      rho_i_over_Ln_max: 0.1,
      lambdaD_over_Ln_max: 0.1,
      beta_max: 0.5,
      nu_over_omega_i_max: 1,
      nu_over_omega_e_max: 1,
      v_over_c_max: 0.1,
      rho_s_over_Ln_max: 0.1,
    });
    expect(() => resolveThresholds(cf, { beta_max: -1, nope: 1 })).toThrow(ValidationError);
  });

  it('does not reject points outside model validity (they are flagged)', () => {
    const v = resolveInputs(cf, { Ti_eV: 5000, B_T: 0.05 });
    expect(cf.evaluate(v).flags).toContain('rho_i_over_Ln');
  });
});

describe('ordering parameters (the validity banner lists each with its threshold or none)', () => {
  it('name real outputs and thresholds, and every threshold watches one ordering', () => {
    for (const m of listModelSummaries()) {
      const outputs = new Set(m.outputs.map((o) => o.name));
      for (const o of m.orderings) {
        expect(outputs.has(o.output), `${m.id} ${o.output}`).toBe(true);
        if (o.threshold) expect(m.thresholds.map((t) => t.name)).toContain(o.threshold);
      }
      const watched = m.orderings.map((o) => o.threshold).filter(Boolean);
      expect([...watched].sort()).toEqual(m.thresholds.map((t) => t.name).sort());
    }
  });
});
