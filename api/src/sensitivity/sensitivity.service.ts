import { Injectable } from '@nestjs/common';
import {
  ConflictError,
  parseSweepDefinition,
  ValidationError,
  type SensitivityQuery,
  type SensitivityReport,
} from '@driftgrid/domain';
import type { AuthUser } from '../auth/current-user.js';
import { HeavyReads } from '../reads/heavy-reads.js';
import { columnByName } from '../sweeps/results-query.js';
import { layoutOf } from '../sweeps/results-reader.js';
import { SweepAccess } from '../sweeps/sweep-access.js';

/** Reports kept per (sweep, output, points stored): a finished sweep never changes. */
const CACHE_SIZE = 64;

/**
 * Sobol indices of one output of a Saltelli-design sweep. Who may read it: whoever may read the sweep
 * (SweepAccess, as for results and series); anyone else gets 404. The column read and the bootstrap run
 * on the heavy-read pool (time budget, per-user limit, stopped when the client goes away); a report once
 * computed is kept here.
 */
@Injectable()
export class SensitivityService {
  private readonly cache = new Map<string, SensitivityReport>();

  constructor(
    private readonly access: SweepAccess,
    private readonly reads: HeavyReads,
  ) {}

  async report(user: AuthUser, id: number, q: SensitivityQuery, signal?: AbortSignal): Promise<SensitivityReport> {
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
    const report = await this.reads.run(
      user.id,
      {
        kind: 'sensitivity',
        sweepId: s.id,
        slot: column.slot,
        params: {
          output: column.name,
          unit: column.unit,
          inputs: def.axes.map((a) => a.param),
          samples: def.sampling.samples,
          points: s.points,
          pointsDone: s.pointsDone,
        },
      },
      { signal },
    );
    if (this.cache.size >= CACHE_SIZE) this.cache.delete(this.cache.keys().next().value!);
    this.cache.set(key, report);
    return report;
  }
}
