import { describe, expect, it } from 'vitest';
import { auditSummary } from './audit-words.js';

describe('audit entries in words', () => {
  it('says what changed on a user, with before and after', () => {
    expect(
      auditSummary('user.update', 'user:7', {
        email: 'rosa@example.com',
        before: { role: 'researcher' },
        after: { role: 'reviewer' },
      }),
    ).toBe('Changed rosa@example.com: role from researcher to reviewer');
    expect(
      auditSummary('user.update', 'user:7', {
        email: 'rosa@example.com',
        before: { active: true },
        after: { active: false },
      }),
    ).toBe('Deactivated the account of rosa@example.com');
  });

  it('names quota limits by the admin’s labels, with null as the role default', () => {
    expect(
      auditSummary('quota.role', 'role:researcher', {
        before: { maxPointsPerSweep: 2_000_000, maxRunningSweeps: 4 },
        after: { maxPointsPerSweep: 1000, maxRunningSweeps: 4 },
      }),
    ).toBe('Changed the researcher quota: Points per sweep from 2,000,000 to 1,000');
    expect(
      auditSummary('quota.user', 'user:3', {
        email: 'remy@example.com',
        before: { maxPointsPerSweep: 20, maxStoredPoints: null },
        after: { maxPointsPerSweep: null, maxStoredPoints: 5 },
      }),
    ).toBe(
      'Changed the quota of remy@example.com: Points per sweep from 20 to the role default and Stored points from the role default to 5',
    );
  });

  it('words invitations and the queue, and falls back to the action without dots', () => {
    expect(auditSummary('invitation.create', 'invitation:4', { email: 'new@example.com', role: 'reviewer' })).toBe(
      'Invited new@example.com as reviewer',
    );
    expect(auditSummary('queue.pause', null, null)).toBe('Paused the queue: no new chunks handed out');
    expect(auditSummary('dataset.purge', 'dataset:9', null)).toBe('Dataset purge (dataset:9)');
  });
});
