import { QuotaGate, type QuotaVerdict } from './ports.js';

/** Used until quotas are configured: everything is allowed. */
export class PermissiveQuotaGate extends QuotaGate {
  verdict(): QuotaVerdict {
    return { allowed: true, violations: [] };
  }
  assertAllowed(): void {}
}
