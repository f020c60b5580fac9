import { describe, expect, it } from 'vitest';
import { CATALOGUE_STATUSES } from './catalogue.js';
import { LIVE_FIT_STATUSES } from './fits.js';
import { ACTIVE_STATES, isActiveState, SWEEP_STATUSES, sweepSubmissionSchema } from './sweeps.js';

describe('sweep enums, declared once', () => {
  it('the catalogue filters by exactly the sweep statuses, and fits share the active states', () => {
    expect(CATALOGUE_STATUSES).toBe(SWEEP_STATUSES);
    expect(LIVE_FIT_STATUSES).toBe(ACTIVE_STATES);
  });

  it('active means queued or running, and nothing finished', () => {
    expect(SWEEP_STATUSES.filter(isActiveState)).toEqual(['queued', 'running']);
    expect(isActiveState('waiting')).toBe(false);
  });
});

describe('sweepSubmissionSchema', () => {
  it('takes any JSON object and refuses arrays, strings and null with a message a user can read', () => {
    expect(sweepSubmissionSchema.safeParse({ name: 'x', axes: 'not checked here' }).success).toBe(true);
    for (const bad of [[], 'x', null, 3]) {
      const r = sweepSubmissionSchema.safeParse(bad);
      expect(r.success).toBe(false);
      expect(r.error?.issues[0].message).toBe('the sweep definition must be a JSON object');
    }
  });
});
