import { describe, expect, it } from 'vitest';
import type { ChunkResultPayload } from './chunk-job.js';
import { decodeFloat64, decodeUint32, encodeFloat64, encodeUint32 } from './chunk-codec.js';
import { InlineResultTransport, InProcessResultTransport } from './result-transport.js';

const payload = (chunkIndex: number): ChunkResultPayload => ({
  sweepId: 7,
  chunkIndex,
  i0: chunkIndex * 3,
  n: 3,
  columns: { Te_eV: new Float64Array([1, 2, 3]) },
  flags: new Uint32Array([0, 1, 4]),
  workerId: 'host:1',
  computeMs: 0.5,
  attempt: 1,
});

describe('result transports', () => {
  it('in-process: the job carries a reference, the api receives the very same arrays once', () => {
    const t = new InProcessResultTransport();
    const p = payload(2);
    const job = t.send(p);
    expect(Object.keys(job).sort()).toEqual(['chunkIndex', 'ref', 'sweepId']);
    expect(t.size).toBe(1);
    expect(t.receive(JSON.parse(JSON.stringify(job)))).toBe(p);
    // A duplicate delivery of the same job finds nothing: the chunk is recomputed, never doubled.
    expect(t.receive(job)).toBeNull();
    expect(t.size).toBe(0);
  });

  it('inline: the payload itself rides in the job and survives JSON', () => {
    const t = new InlineResultTransport();
    const p = {
      ...payload(0),
      columns: { Te_eV: encodeFloat64(new Float64Array([1.5, -2e300, Number.MIN_VALUE])) },
      flags: encodeUint32(new Uint32Array([0, 0xffffffff, 3])),
    };
    const got = t.receive(JSON.parse(JSON.stringify(t.send(p))))!;
    expect(Array.from(decodeFloat64(got.columns.Te_eV))).toEqual([1.5, -2e300, Number.MIN_VALUE]);
    expect(Array.from(decodeUint32(got.flags))).toEqual([0, 0xffffffff, 3]);
  });
});
