import { checkParamNames, resolveBounds, startValue, type CheckedData } from '../input.js';
import type { CompiledModel, FitInput } from '../types.js';

/** Least-squares straight line through (x, y): slope and intercept. */
function line(x: number[], y: number[]): { slope: number; intercept: number } {
  const n = x.length;
  const mx = x.reduce((s, v) => s + v, 0) / n;
  const my = y.reduce((s, v) => s + v, 0) / n;
  let sxx = 0;
  let sxy = 0;
  for (let i = 0; i < n; i++) {
    sxx += (x[i]! - mx) ** 2;
    sxy += (x[i]! - mx) * (y[i]! - my);
  }
  const slope = sxx > 0 ? sxy / sxx : NaN;
  return { slope, intercept: my - slope * mx };
}

function span(v: Float64Array): number {
  let lo = Infinity;
  let hi = -Infinity;
  for (const x of v) {
    lo = Math.min(lo, x);
    hi = Math.max(hi, x);
  }
  return hi - lo || 1;
}

/**
 * Single probe, electron-retardation region: I(V) = I_is·(exp((V − V_f)/Te) − 1) [+ slope·(V − V_f)],
 * electron current positive, ion saturation current I_is > 0 (Hutchinson, Principles of Plasma Diagnostics,
 * electric probes chapter, from memory). The optional linear term stands for the sheath expansion that
 * makes the ion current keep growing below V_f; it vanishes at V_f, so V_f stays the zero-current voltage.
 */
export function compileProbeRetarding(input: FitInput, data: CheckedData): CompiledModel {
  const withSlope = input.sheathSlope === true;
  const names = withSlope ? ['I_is', 'V_f', 'Te_eV', 'slope'] : ['I_is', 'V_f', 'Te_eV'];
  checkParamNames(input, names);
  const { n, y } = data;
  const v = data.x[0]!;
  const guess = retardingGuess(v, y);
  const start = Float64Array.from(
    names.map((name, j) => startValue(input, name, [guess.iis, guess.vf, guess.te, 0][j]!)),
  );
  const { min, max } = resolveBounds(input, names, start, { I_is: { min: 0 }, Te_eV: { min: 1e-6 } });
  const evaluate = (p: Float64Array, out: Float64Array): void => {
    const [iis, vf, te] = [p[0]!, p[1]!, p[2]!];
    const s = withSlope ? p[3]! : 0;
    for (let i = 0; i < n; i++) out[i] = iis * Math.expm1((v[i]! - vf) / te) + s * (v[i]! - vf);
  };
  const jacobian = (p: Float64Array, jac: Float64Array): void => {
    const [iis, vf, te] = [p[0]!, p[1]!, p[2]!];
    const s = withSlope ? p[3]! : 0;
    for (let i = 0; i < n; i++) {
      const d = v[i]! - vf;
      const e = Math.exp(d / te);
      jac[i] = e - 1;
      jac[n + i] = (-iis * e) / te - s;
      jac[2 * n + i] = (-iis * e * d) / (te * te);
      if (withSlope) jac[3 * n + i] = d;
    }
  };
  return { paramNames: names, start, min, max, n, evaluate, jacobian };
}

/** Start values: I_is from the lowest tenth of V, V_f where I crosses 0, Te from ln(I + I_is) against V. */
function retardingGuess(v: Float64Array, y: Float64Array): { iis: number; vf: number; te: number } {
  const order = Array.from(v, (_, i) => i).sort((a, b) => v[a]! - v[b]!);
  const low = order.slice(0, Math.max(2, Math.floor(order.length / 10)));
  const iis = Math.max(
    -low.reduce((s, i) => s + y[i]!, 0) / low.length,
    1e-12 * (Math.max(...Array.from(y, Math.abs)) || 1),
  );
  let vf = v[order[Math.floor(order.length / 2)]!]!;
  for (let k = 1; k < order.length; k++) {
    const a = order[k - 1]!;
    const b = order[k]!;
    if (y[a]! <= 0 && y[b]! > 0) {
      vf = v[a]! + ((v[b]! - v[a]!) * -y[a]!) / (y[b]! - y[a]!);
      break;
    }
  }
  const xs: number[] = [];
  const ls: number[] = [];
  for (const i of order) {
    const ratio = (y[i]! + iis) / iis;
    if (ratio > 0.3) {
      xs.push(v[i]!);
      ls.push(Math.log(ratio));
    }
  }
  const fit = xs.length >= 3 ? line(xs, ls) : { slope: NaN };
  const te = fit.slope > 0 && Number.isFinite(1 / fit.slope) ? 1 / fit.slope : span(v) / 10;
  return { iis, vf, te };
}

/**
 * Symmetric double probe: I(V) = I_is·tanh(V/(2·Te)) [+ slope·V], I_is the ion saturation current of
 * one tip (Hutchinson, electric probes chapter, from memory). The slope term takes up the sheath
 * expansion of the saturation branches.
 */
export function compileProbeDouble(input: FitInput, data: CheckedData): CompiledModel {
  const withSlope = input.sheathSlope === true;
  const names = withSlope ? ['I_is', 'Te_eV', 'slope'] : ['I_is', 'Te_eV'];
  checkParamNames(input, names);
  const { n, y } = data;
  const v = data.x[0]!;
  let hi = -Infinity;
  let lo = Infinity;
  for (const c of y) {
    hi = Math.max(hi, c);
    lo = Math.min(lo, c);
  }
  const iisGuess = (hi - lo) / 2 || 1;
  const width = span(v);
  const xs: number[] = [];
  const ys: number[] = [];
  for (let i = 0; i < n; i++) {
    if (Math.abs(y[i]!) < 0.5 * iisGuess) {
      xs.push(v[i]!);
      ys.push(y[i]!);
    }
  }
  const central = xs.length >= 3 ? line(xs, ys).slope : NaN;
  const teGuess = central > 0 ? iisGuess / (2 * central) : width / 10;
  const start = Float64Array.from(names.map((name, j) => startValue(input, name, [iisGuess, teGuess, 0][j]!)));
  const { min, max } = resolveBounds(input, names, start, { I_is: { min: 0 }, Te_eV: { min: 1e-6 } });
  const evaluate = (p: Float64Array, out: Float64Array): void => {
    const s = withSlope ? p[2]! : 0;
    for (let i = 0; i < n; i++) out[i] = p[0]! * Math.tanh(v[i]! / (2 * p[1]!)) + s * v[i]!;
  };
  const jacobian = (p: Float64Array, jac: Float64Array): void => {
    const [iis, te] = [p[0]!, p[1]!];
    for (let i = 0; i < n; i++) {
      const u = v[i]! / (2 * te);
      const th = Math.tanh(u);
      jac[i] = th;
      jac[n + i] = -iis * (1 - th * th) * (u / te);
      if (withSlope) jac[2 * n + i] = v[i]!;
    }
  };
  return { paramNames: names, start, min, max, n, evaluate, jacobian };
}
