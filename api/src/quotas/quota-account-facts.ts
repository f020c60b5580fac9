import { Injectable } from '@nestjs/common';
import type { MeResponse } from '@driftgrid/domain';
import { AccountFacts } from '../auth/me.service.js';
import type { AuthUser } from '../auth/current-user.js';
import { QuotasService } from './quotas.service.js';

/** GET /api/auth/me gains `quota` (effective limits) and `usage`. */
@Injectable()
export class QuotaAccountFacts extends AccountFacts {
  constructor(private readonly quotas: QuotasService) {
    super();
  }

  facts(user: AuthUser): Pick<MeResponse, 'quota' | 'usage'> {
    return { quota: this.quotas.effectiveQuota(user.id, user.role), usage: this.quotas.usage(user.id) };
  }
}
