/**
 * The contract every physics model fulfils. A model is a pure function of one point plus a
 * chunk evaluator that fills preallocated column arrays (no per-point allocation), which is what
 * the worker calls. Units are canonical: SI, temperatures in eV.
 */

export interface InputSpec {
  /** Key used in the api, stored data and expressions, e.g. `Te_eV`. */
  name: string;
  /** Display symbol, e.g. `T_e`. */
  symbol: string;
  /** Canonical unit as a mathjs unit string (`eV`, `T`, `m`, `m^-3`, `V/m`, `V`) or `1` for dimensionless. */
  unit: string;
  default: number;
  /** Allowed range; `minExclusive` means the value must be strictly greater than `min`. */
  min: number;
  max: number;
  minExclusive?: boolean;
  integer?: boolean;
  /** One line of meaning for forms and exports. */
  meaning: string;
  /**
   * When set, the input (a density) also accepts a pressure ("1 Pa", "7.5 mTorr"), converted as
   * n = p/(k_B T) at the temperature input of this name.
   */
  pressureAt?: string;
}

export interface OutputSpec {
  name: string;
  symbol: string;
  unit: string;
  kind: 'number' | 'boolean';
  meaning: string;
  /**
   * Column group in tables (drifts, scales, orderings, flags…). Optional: without it the group follows
   * from the unit (domain/src/plot/columns.ts).
   */
  group?: OutputGroup;
}

export type OutputGroup = 'drifts' | 'scales' | 'orderings' | 'collisions' | 'flags' | 'other';

export interface FlagSpec {
  /** Stable code stored with results, e.g. `rho_i_over_Ln`. */
  code: string;
  /** Bit in the chunk flag mask (1 << bit). */
  bit: number;
  /** When true the flag marks the point as outside the model's validity (valid = false). */
  invalidates: boolean;
  /** Plain-language explanation shown in the ui and the export README. */
  meaning: string;
  /**
   * The ordering parameter behind the flag: raised when `output` ≥ the threshold named `threshold`
   * (`below: true`: when it is ≤). Plots draw the regime boundary output = threshold. Optional: without
   * it an output named like the flag and a threshold `<code>_max` are used (domain/src/plot/regimes.ts).
   */
  ordering?: { output: string; threshold: string; below?: boolean };
}

/** A validity threshold a sweep may override (e.g. ρ_i/L_n ≥ 0.1 flags the drift ordering). */
export interface ThresholdSpec {
  name: string;
  default: number;
  meaning: string;
}

export type Thresholds = Record<string, number>;

export interface PointResult {
  outputs: Record<string, number | boolean>;
  flags: string[];
}

/** Radial arrays for plotting (column-profile only): `r_m` plus one array per profile quantity. */
export type Profile = Record<string, number[]>;

export interface ChunkOutput {
  /** One Float64Array per numeric output, each of length n. Booleans are stored as 0/1. */
  columns: Record<string, Float64Array>;
  /** Flag bit mask per point. */
  flags: Uint32Array;
}

/** An ordering parameter the model's validity rests on: an output, and the threshold that flags it (or none). */
export interface OrderingSpec {
  output: string;
  /** Threshold name in `thresholds`, or null when no flag watches this ordering. */
  threshold: string | null;
}

export interface ModelDefinition {
  id: string;
  /** Semantic version; bumped whenever outputs could change for the same inputs. */
  version: string;
  title: string;
  summary: string;
  inputs: InputSpec[];
  outputs: OutputSpec[];
  flags: FlagSpec[];
  thresholds: ThresholdSpec[];
  /** The ordering parameters, each with its threshold or none (the ui's validity banner lists them all). */
  orderings: OrderingSpec[];
  /** Evaluate one point; inputs are complete and already validated (canonical units). */
  evaluate(inputs: Record<string, number>, thresholds?: Thresholds): PointResult;
  /**
   * Evaluate n points whose inputs are given as columns (one Float64Array per input, length ≥ n)
   * into `out` (preallocated by `allocateChunk`).
   */
  evaluateChunk(inputs: Record<string, Float64Array>, n: number, out: ChunkOutput, thresholds?: Thresholds): void;
  /** Radial profiles for the single-point page (column-profile only). */
  profile?(inputs: Record<string, number>): Profile;
}
