import { describe, expect, it } from 'vitest';
import { roles, type Role } from './auth';
import { jobStatuses, type JobStatus } from './jobs';
import {
  acceptsReadings,
  allowedMoves,
  canApprove,
  canBill,
  canPropose,
  canSignOff,
  hasRole,
  JOB_MOVES,
  jobMove,
  mayMove,
  moveOnEvent,
  readingRefusal,
  reportReady,
  roleRank,
  ROLES,
  statusesTakingReadings,
} from './policy';
import { readingPhases } from './readings';

// The flow as the shop runs it, written out move by move: the table must say exactly this.
const EXPECTED: [JobStatus, JobStatus, 'patch' | 'review', readonly Role[]][] = [
  ['received', 'diagnosing', 'patch', ['admin', 'lead', 'tech']],
  ['diagnosing', 'awaiting-review', 'patch', ['admin', 'lead', 'tech']],
  ['awaiting-review', 'approved', 'review', ['admin', 'lead']],
  ['awaiting-review', 'diagnosing', 'review', ['admin', 'lead']],
  ['approved', 'repaired', 'patch', ['admin', 'lead', 'tech']],
  ['repaired', 'verified', 'patch', ['admin', 'lead']],
  ['repaired', 'diagnosing', 'patch', ['admin', 'lead', 'tech']],
  ['verified', 'returned', 'patch', ['admin', 'lead', 'tech']],
];

describe('job status transitions', () => {
  it('walks every pair of statuses and every role against the table', () => {
    for (const from of jobStatuses) {
      for (const to of jobStatuses) {
        const expected = EXPECTED.find(([f, t]) => f === from && t === to);
        expect(jobMove(from, to)?.via, `${from} → ${to}`).toBe(expected?.[2]);
        for (const role of roles) {
          const may = !!expected && expected[3].includes(role);
          expect(mayMove(from, to, role), `${role}: ${from} → ${to}`).toBe(may);
          expect(mayMove(from, to, role, 'patch'), `${role} by edit: ${from} → ${to}`).toBe(may && expected[2] === 'patch');
          expect(mayMove(from, to, role, 'review'), `${role} by review: ${from} → ${to}`).toBe(may && expected[2] === 'review');
        }
      }
    }
    expect(JOB_MOVES).toHaveLength(EXPECTED.length);
  });

  it('every status is reachable from received and every non-final status has a way on', () => {
    const reached = new Set<JobStatus>(['received']);
    for (let grew = true; grew;) {
      grew = false;
      for (const m of JOB_MOVES) if (reached.has(m.from) && !reached.has(m.to)) grew = !!reached.add(m.to);
    }
    expect([...reached].sort()).toEqual([...jobStatuses].sort());
    for (const s of jobStatuses) if (s !== 'returned') expect(allowedMoves(s, 'admin').length, s).toBeGreaterThan(0);
    expect(allowedMoves('returned', 'admin')).toEqual([]);
  });

  it('lists the moves a role may make, by edit or by review', () => {
    expect(allowedMoves('awaiting-review', 'lead')).toEqual(['approved', 'diagnosing']);
    expect(allowedMoves('awaiting-review', 'lead', 'patch')).toEqual([]);
    expect(allowedMoves('awaiting-review', 'tech')).toEqual([]);
    expect(allowedMoves('repaired', 'tech')).toEqual(['diagnosing']);
    expect(allowedMoves('repaired', 'lead')).toEqual(['verified', 'diagnosing']);
    expect(allowedMoves('received', 'trainee')).toEqual([]);
    expect(allowedMoves('received', undefined)).toEqual([]);
  });

  it('each event makes exactly one move, and it is a move of the table', () => {
    for (const event of ['diagnosis-reading', 'quote-approval'] as const) {
      expect(JOB_MOVES.filter((m) => m.events?.includes(event))).toHaveLength(1);
      expect(moveOnEvent(event)).toMatchObject({ from: 'received', to: 'diagnosing' });
    }
  });
});

describe('roles', () => {
  it('each set is the roles of a rank and above', () => {
    expect(ROLES.everyone).toEqual(['admin', 'lead', 'tech', 'trainee']);
    expect(ROLES.bench).toEqual(['admin', 'lead', 'tech']);
    expect(ROLES.reviewers).toEqual(['admin', 'lead']);
    expect(ROLES.admins).toEqual(['admin']);
    for (const [name, set] of Object.entries(ROLES)) {
      const lowest = Math.min(...set.map(roleRank));
      expect(set, name).toEqual(roles.filter((r) => roleRank(r) >= lowest));
    }
  });

  it('hasRole and canBill refuse a missing role', () => {
    expect(hasRole(undefined, ROLES.everyone)).toBe(false);
    expect(hasRole('trainee', ROLES.everyone)).toBe(true);
    expect(roles.filter(canBill)).toEqual(['admin', 'lead', 'tech']);
    expect(canBill(null)).toBe(false);
  });
});

describe('what a status accepts', () => {
  it('takes diagnosis readings before the review and verification readings between approval and sign-off', () => {
    const table = Object.fromEntries(readingPhases.map((p) => [p, jobStatuses.filter((s) => acceptsReadings(s, p))]));
    expect(table).toEqual({ diagnosis: ['received', 'diagnosing'], verification: ['approved', 'repaired'] });
    for (const p of readingPhases) expect(statusesTakingReadings(p)).toEqual(table[p]);
  });

  it('keeps trainees to diagnosis steps on their own jobs', () => {
    expect(readingRefusal('tech', 'verification', false)).toBeNull();
    expect(readingRefusal('trainee', 'diagnosis', true)).toBeNull();
    expect(readingRefusal('trainee', 'diagnosis', false)).toMatch(/assigned to them/);
    expect(readingRefusal('trainee', 'verification', true)).toMatch(/technician/);
  });

  it('proposes from received or diagnosing, approves awaiting review, signs off repaired', () => {
    const where = (f: (s: JobStatus, r: Role) => boolean, role: Role) => jobStatuses.filter((s) => f(s, role));
    expect(where(canPropose, 'tech')).toEqual(['received', 'diagnosing']);
    expect(where(canPropose, 'trainee')).toEqual([]);
    expect(where(canApprove, 'lead')).toEqual(['awaiting-review']);
    expect(where(canApprove, 'tech')).toEqual([]);
    expect(where(canSignOff, 'admin')).toEqual(['repaired']);
    expect(where(canSignOff, 'tech')).toEqual([]);
    expect(jobStatuses.filter(reportReady)).toEqual(['verified', 'returned']);
  });
});
