import { Injectable } from '@nestjs/common';
import type { AuthUser } from './current-user.js';

/** Extra facts about the signed-in user (quotas and usage); later modules contribute providers. */
export abstract class AccountFacts {
  abstract facts(user: AuthUser): Record<string, unknown>;
}

@Injectable()
export class MeService {
  constructor(private readonly extra: AccountFacts) {}

  describe(user: AuthUser) {
    return {
      user: { id: user.id, email: user.email, name: user.name, role: user.role },
      via: user.via,
      scope: user.scope,
      ...this.extra.facts(user),
    };
  }
}

export class NoAccountFacts extends AccountFacts {
  facts(): Record<string, unknown> {
    return {};
  }
}
