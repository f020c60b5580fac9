import { Injectable } from '@nestjs/common';
import {
  getModel,
  listModelSummaries,
  modelSummary,
  resolveInputs,
  resolveThresholds,
  type ModelSummary,
  type Profile,
} from '@driftgrid/domain';
import type { EvaluateRequest } from './dto/evaluate.dto.js';

/** SPEC §6 evaluate shape, plus the canonical inputs actually used (defaults filled, units converted). */
export interface EvaluateResponse {
  model: string;
  modelVersion: string;
  inputs: Record<string, number>;
  outputs: Record<string, number | boolean | null>;
  flags: string[];
  profile?: Profile;
}

/** JSON has no NaN or ±Infinity; an output the model could not compute is sent as null. */
function jsonSafe(v: number | boolean): number | boolean | null {
  return typeof v === 'number' && !Number.isFinite(v) ? null : v;
}

@Injectable()
export class ModelsService {
  list(): { items: ModelSummary[]; total: number } {
    const items = listModelSummaries();
    return { items, total: items.length };
  }

  /** Throws NotFoundError naming the known ids (domain's getModel). */
  detail(id: string): ModelSummary {
    return modelSummary(getModel(id));
  }

  /** One point: validates inputs (400 naming field and range), fills defaults, evaluates. */
  evaluate(id: string, body: EvaluateRequest): EvaluateResponse {
    const model = getModel(id);
    const inputs = resolveInputs(model, body.inputs);
    const thresholds = resolveThresholds(model, body.thresholds);
    const point = model.evaluate(inputs, thresholds);
    const outputs: EvaluateResponse['outputs'] = {};
    for (const [k, v] of Object.entries(point.outputs)) outputs[k] = jsonSafe(v);
    const res: EvaluateResponse = { model: model.id, modelVersion: model.version, inputs, outputs, flags: point.flags };
    if (model.profile) {
      const prof = model.profile(inputs);
      const safe: Profile = {};
      // Arrays keep their length; non-finite entries (none expected inside the grid) become null.
      for (const [k, arr] of Object.entries(prof))
        safe[k] = arr.map((x) => (Number.isFinite(x) ? x : (null as unknown as number)));
      res.profile = safe;
    }
    return res;
  }
}
