import { Injectable } from '@nestjs/common';
import {
  ConflictError,
  estimateSobolIndices,
  parseSweepDefinition,
  saltelliOutputs,
  ValidationError,
  type SensitivityQuery,
  type SensitivityReport,
} from '@driftgrid/domain';
import type { AuthUser } from '../auth/current-user.js';
import { columnByName } from '../sweeps/results-query.js';
import { layoutOf } from '../sweeps/results-reader.js';
import { SweepAccess } from '../sweeps/sweep-access.js';
import type { SweepRow } from '../sweeps/sweeps.repository.js';
import { SensitivityRepository } from './sensitivity.repository.js';

/** Reports kept per (sweep, output, points stored): a finished sweep never changes. */
const CACHE_SIZE = 64;

const ESTIMATORS = {
  first: 'Saltelli et al. 2010 (Comput. Phys. Commun. 181, 259), Table 2 (b)',
  total: 'Jansen 1999 (Comput. Phys. Commun. 117, 35); Saltelli et al. 2010, Table 2 (f)',
};

/**
 * Sobol indices of one output of a Saltelli-design sweep. Who may read it: whoever may read the sweep
 * (SweepAccess, as for results and series); anyone else gets 404.
 */
@Injectable()
export class SensitivityService {
  private readonly cache = new Map<string, SensitivityReport>();

  constructor(
    private readonly access: SweepAccess,
    private readonly repo: SensitivityRepository,
  ) {}

  report(user: AuthUser, id: number, q: SensitivityQuery): SensitivityReport {
    const s = this.access.readable(user, id);
    const def = parseSweepDefinition(JSON.parse(s.definition));
    if (def.sampling.kind !== 'saltelli')
      throw new ConflictError(
        `Sweep ${id} uses ${def.sampling.kind} sampling; sensitivity indices need the Saltelli design (sampling kind "saltelli")`,
      );
    const column = columnByName(layoutOf(s), q.output, 'output');
    if ((column.kind !== 'output' && column.kind !== 'derived') || column.type === 'mask')
      throw new ValidationError(`output: ${q.output} is not an output of the sweep`, [
        {
          path: 'output',
          message: `${q.output} is ${column.kind === 'input' ? 'an input' : 'not a value'}; pick an output or derived column`,
        },
      ]);

    const key = `${s.id}:${column.name}:${s.pointsDone}`;
    const hit = this.cache.get(key);
    if (hit) return hit;
    const report = this.compute(
      s,
      column.name,
      column.slot,
      column.unit,
      def.axes.map((a) => a.param),
      def.sampling.samples,
    );
    if (this.cache.size >= CACHE_SIZE) this.cache.delete(this.cache.keys().next().value!);
    this.cache.set(key, report);
    return report;
  }

  private compute(
    s: SweepRow,
    output: string,
    slot: string,
    unit: string,
    inputs: string[],
    samples: number,
  ): SensitivityReport {
    const values = this.repo.columnByIndex(s.id, slot, s.points);
    const groups = saltelliOutputs(values, inputs.length, samples);
    if (groups.n < 2)
      throw new ConflictError(
        `${output}: only ${groups.n} of ${samples} sample groups are complete with finite values; at least 2 are needed` +
          (s.pointsDone < s.points ? ' (the sweep is still computing)' : ''),
      );
    const est = estimateSobolIndices(groups);
    return {
      output,
      unit,
      n: est.n,
      dropped: groups.dropped,
      samples,
      variance: est.variance,
      indices: est.indices.map((ix, i) => ({ input: inputs[i]!, ...ix })),
      bootstrap: { method: 'percentile', ...est.bootstrap },
      estimators: ESTIMATORS,
    };
  }
}
