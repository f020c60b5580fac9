import { z } from 'zod';

/** OpenAPI schema for a zod contract, so the docs show exactly what validation enforces. */
export function openApiSchema(schema: z.ZodType): Record<string, unknown> {
  const json = z.toJSONSchema(schema, { unrepresentable: 'any', io: 'input' }) as Record<string, unknown>;
  delete json.$schema;
  return json;
}
