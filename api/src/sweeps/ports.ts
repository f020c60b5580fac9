import type { QuotaVerdict, RoleName } from '@driftgrid/domain';

/** Quota checks the sweep service consults (synchronous, so check + insert is one atomic step). */
export abstract class QuotaGate {
  abstract verdict(userId: number, role: RoleName, points: number): QuotaVerdict;
  abstract assertAllowed(userId: number, role: RoleName, points: number): void;
  /** Records the submitted points in the 30-day ledger, which deleting or cancelling never refunds. */
  abstract charge(userId: number, sweepId: number, points: number): void;
}

/** Tells a sweep's owner that it finished (e-mail once the mail module is wired). */
export abstract class SweepNotifier {
  abstract sweepFinished(event: {
    sweepId: number;
    ownerId: number;
    name: string;
    status: 'completed' | 'failed';
    error?: string | null;
  }): Promise<void>;
}
