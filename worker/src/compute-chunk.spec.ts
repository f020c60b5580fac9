import { describe, expect, it } from 'vitest';
import { compileSweep, getModel, ValidationError } from '@driftgrid/domain';
import { computeChunk } from './compute-chunk.js';
import type { ChunkJobData } from './chunk-job.js';

const definition = {
  name: 'two points',
  model: 'cross-field',
  sampling: { kind: 'grid' },
  axes: [{ param: 'Te_eV', kind: 'list', values: [5, 10] }],
};

function job(over: Partial<ChunkJobData>): ChunkJobData {
  return { sweepId: 1, chunkIndex: 0, i0: 0, i1: 2, definition, definitionHash: 'h', ...over };
}

describe('computeChunk and the model version a sweep was created with', () => {
  it('computes when the worker has the same model version', () => {
    const version = compileSweep(definition).model.version;
    const out = computeChunk(job({ sweepId: 101, modelVersion: version }));
    expect(out.n).toBe(2);
  });

  it('refuses, naming both versions, when the registry has moved on since the sweep was created', () => {
    const current = getModel('cross-field').version;
    const run = () => computeChunk(job({ sweepId: 102, modelVersion: '1.0.0' }));
    expect(current).not.toBe('1.0.0');
    expect(run).toThrow(ValidationError);
    expect(run).toThrow(new RegExp(`version 1\\.0\\.0.*version ${current.replace(/\./g, '\\.')}`));
  });

  it('reads jobs queued before the version was carried (no modelVersion)', () => {
    expect(computeChunk(job({ sweepId: 103 })).n).toBe(2);
  });
});
