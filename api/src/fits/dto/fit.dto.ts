import { fitRequestSchema } from '@driftgrid/domain';
import { z } from 'zod';

/**
 * The POST /api/fits body: the domain contract, with `source.id` accepted as a number too (ids are
 * integers in the api; the domain schema takes them as strings).
 */
export const createFitSchema = z.preprocess((raw) => {
  if (raw && typeof raw === 'object' && !Array.isArray(raw)) {
    const body = raw as Record<string, unknown>;
    const source = body.source as Record<string, unknown> | undefined;
    if (source && typeof source === 'object' && typeof source.id === 'number')
      return { ...body, source: { ...source, id: String(source.id) } };
  }
  return raw;
}, fitRequestSchema);

export const fitListQuerySchema = z
  .object({
    sourceKind: z.enum(['sweep', 'dataset'], { error: 'sourceKind must be "sweep" or "dataset"' }).optional(),
    sourceId: z.coerce
      .number({ error: 'sourceId must be a number' })
      .int('sourceId must be an integer')
      .positive('sourceId must be positive')
      .optional(),
    page: z.coerce.number().int('page must be an integer').min(1, 'page starts at 1').default(1),
    pageSize: z.coerce
      .number()
      .int('pageSize must be an integer')
      .min(1, 'pageSize is at least 1')
      .max(1000, 'pageSize is at most 1000')
      .default(50),
  })
  .strict();

export type FitListQuery = z.infer<typeof fitListQuerySchema>;
