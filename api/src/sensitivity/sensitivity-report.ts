import { ConflictError, estimateSobolIndices, saltelliOutputs, type SensitivityReport } from '@driftgrid/domain';

const ESTIMATORS = {
  first: 'Saltelli et al. 2010 (Comput. Phys. Commun. 181, 259), Table 2 (b)',
  total: 'Jansen 1999 (Comput. Phys. Commun. 117, 35); Saltelli et al. 2010, Table 2 (f)',
};

/** What the report needs besides the column: plain data, so it can cross to a pool thread. */
export interface SensitivityInputs {
  output: string;
  unit: string;
  /** Swept inputs in axis order. */
  inputs: string[];
  samples: number;
  points: number;
  pointsDone: number;
}

/**
 * Sobol indices with bootstrap intervals from one output column by point index. The bootstrap costs
 * most of a second on a large design, which is why it runs on a heavy-read pool thread beside the read.
 */
export function sensitivityReport(values: Float64Array, p: SensitivityInputs): SensitivityReport {
  const groups = saltelliOutputs(values, p.inputs.length, p.samples);
  if (groups.n < 2)
    throw new ConflictError(
      `${p.output}: only ${groups.n} of ${p.samples} sample groups are complete with finite values; at least 2 are needed` +
        (p.pointsDone < p.points ? ' (the sweep is still computing)' : ''),
    );
  const est = estimateSobolIndices(groups);
  return {
    output: p.output,
    unit: p.unit,
    n: est.n,
    dropped: groups.dropped,
    samples: p.samples,
    variance: est.variance,
    indices: est.indices.map((ix, i) => ({ input: p.inputs[i]!, ...ix })),
    bootstrap: { method: 'percentile', ...est.bootstrap },
    estimators: ESTIMATORS,
  };
}
