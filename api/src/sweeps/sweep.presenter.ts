import type { SweepDefinitionInput, SweepView } from '@driftgrid/domain';
import { columnViews, layoutOf } from './sweep-layout.js';
import type { SweepRow } from './sweeps.repository.js';

export interface SweepOwner {
  id: number;
  name: string;
  email: string;
}

/** The SPEC §6 sweep shape (the domain's sweepViewSchema; tests/api/sweep-contracts.test.ts parses it strictly). */
export function presentSweep(
  s: SweepRow,
  extra: {
    tags: string[];
    owner: SweepOwner;
    workers: { id: string; chunks: number; points: number }[];
    sharedWith?: number[];
  },
): SweepView {
  return {
    id: s.id,
    name: s.name,
    model: s.model,
    status: s.status,
    points: s.points,
    progress: { done: s.pointsDone, total: s.points, fraction: s.points ? s.pointsDone / s.points : 0 },
    chunks: s.chunkCount,
    definition: JSON.parse(s.definition) as SweepDefinitionInput,
    columns: columnViews(layoutOf(s)),
    tags: extra.tags,
    owner: extra.owner,
    visibility: s.visibility,
    sharedWith: extra.sharedWith ?? [],
    createdAt: new Date(s.createdAt).toISOString(),
    startedAt: s.startedAt ? new Date(s.startedAt).toISOString() : null,
    finishedAt: s.finishedAt ? new Date(s.finishedAt).toISOString() : null,
    error: s.error,
    flagsSummary: { invalidPoints: s.invalidPoints, byFlag: JSON.parse(s.flagCounts) as Record<string, number> },
    provenance: {
      modelVersion: s.modelVersion,
      appVersion: s.appVersion,
      computeMs: Math.round(s.computeMs),
      workers: extra.workers,
    },
    ...(s.archiveSha256
      ? {
          archive: {
            sha256: s.archiveSha256,
            bytes: s.archiveBytes,
            archivedAt: s.archivedAt ? new Date(s.archivedAt).toISOString() : null,
          },
        }
      : {}),
  };
}
