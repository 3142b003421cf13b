import { jobTransitions, type JobStatus, type Role } from '@splitscope/contract';
import { ROLES } from '../../auth/guards';

export interface TransitionRule {
  roles: readonly Role[];
  /** Approve and send back are decisions with a comment: they go through POST /jobs/:id/reviews. */
  via: 'patch' | 'review';
  /** What the move is called in messages and the audit log. */
  name: string;
}

const rules: Partial<Record<`${JobStatus}>${JobStatus}`, TransitionRule>> = {
  'received>diagnosing': { roles: ROLES.bench, via: 'patch', name: 'starting the diagnosis' },
  'diagnosing>awaiting-review': { roles: ROLES.bench, via: 'patch', name: 'proposing a part for review' },
  'awaiting-review>approved': { roles: ROLES.reviewers, via: 'review', name: 'approving the diagnosis' },
  'awaiting-review>diagnosing': { roles: ROLES.reviewers, via: 'review', name: 'sending the diagnosis back' },
  'approved>repaired': { roles: ROLES.bench, via: 'patch', name: 'marking the repair done' },
  'repaired>verified': { roles: ROLES.reviewers, via: 'patch', name: 'signing off the repair' },
  'repaired>diagnosing': { roles: ROLES.bench, via: 'patch', name: 'reopening the diagnosis' },
  'verified>returned': { roles: ROLES.bench, via: 'patch', name: 'returning the board' },
};

export function ruleOf(from: JobStatus, to: JobStatus): TransitionRule | undefined {
  return jobTransitions[from].includes(to) ? rules[`${from}>${to}`] : undefined;
}

/** The statuses someone in `role` may move a job to from `from` (through PATCH or a review). */
export function allowedFor(from: JobStatus, role: Role, via?: TransitionRule['via']): JobStatus[] {
  return jobTransitions[from].filter((to) => {
    const r = ruleOf(from, to);
    return r && r.roles.includes(role) && (!via || r.via === via);
  });
}
