import { Injectable } from '@nestjs/common';
import type { MeResponse } from '@driftgrid/domain';
import type { AuthUser } from './current-user.js';

/** The quota and usage facts of the signed-in user, contributed by the quotas module. */
export abstract class AccountFacts {
  abstract facts(user: AuthUser): Pick<MeResponse, 'quota' | 'usage'>;
}

/** GET /api/auth/me (the domain's MeResponse). */
@Injectable()
export class MeService {
  constructor(private readonly extra: AccountFacts) {}

  describe(user: AuthUser): MeResponse {
    return {
      user: { id: user.id, email: user.email, name: user.name, role: user.role },
      via: user.via,
      scope: user.scope,
      ...this.extra.facts(user),
    };
  }
}
