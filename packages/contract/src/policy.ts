// The rules of the job, in one place: who may do what, and which job status accepts what. The server's guards
// and services, the SQL the server builds and the web's screens all call these functions; none of them decides
// a rule of its own. Pure functions over plain values, so both sides run the same code.
import type { Role } from './auth';
import type { JobStatus } from './jobs';
import type { ReadingPhase } from './readings';

/** Each role may do everything the roles below it may (a lead is also a technician). */
const RANK: Record<Role, number> = { trainee: 0, tech: 1, lead: 2, admin: 3 };

export const roleRank = (role: Role): number => RANK[role];

/** The roles of rank `min` and above, highest first. */
function atLeast(min: Role): readonly Role[] {
  return (Object.keys(RANK) as Role[]).filter((r) => RANK[r] >= RANK[min]).sort((a, b) => RANK[b] - RANK[a]);
}

/** Roles by what they may do; routes, services and screens name these instead of listing roles again. */
export const ROLES = {
  everyone: atLeast('trainee'),
  /** Technicians and up: take readings on any job, quote, invoice, record repairs. */
  bench: atLeast('tech'),
  /** Leads and admins: approve diagnoses, sign off repairs, edit board models and customers. */
  reviewers: atLeast('lead'),
  admins: atLeast('admin'),
} as const satisfies Record<string, readonly Role[]>;

export const hasRole = (role: Role | null | undefined, allowed: readonly Role[]): boolean => !!role && allowed.includes(role);

/** How a move is asked for: an edit of the job (PATCH) or a review decision with a comment. */
export type MoveVia = 'patch' | 'review';
/** Events that make a move by themselves, without anyone asking for it. */
export type MoveEvent = 'diagnosis-reading' | 'quote-approval';

export interface JobMove {
  from: JobStatus;
  to: JobStatus;
  via: MoveVia;
  /** Who may ask for the move. */
  roles: readonly Role[];
  /** What the move is called in messages and the audit log. */
  name: string;
  /** Events that make this move on their own (the first diagnosis reading starts the diagnosis). */
  events?: readonly MoveEvent[];
}

/**
 * The job status flow: every allowed move, and nothing else. Approval and sending back happen through a review;
 * a repaired board whose verification fails goes back to diagnosing.
 */
export const JOB_MOVES: readonly JobMove[] = [
  { from: 'received', to: 'diagnosing', via: 'patch', roles: ROLES.bench, name: 'starting the diagnosis', events: ['diagnosis-reading', 'quote-approval'] },
  { from: 'diagnosing', to: 'awaiting-review', via: 'patch', roles: ROLES.bench, name: 'proposing a part for review' },
  { from: 'awaiting-review', to: 'approved', via: 'review', roles: ROLES.reviewers, name: 'approving the diagnosis' },
  { from: 'awaiting-review', to: 'diagnosing', via: 'review', roles: ROLES.reviewers, name: 'sending the diagnosis back' },
  { from: 'approved', to: 'repaired', via: 'patch', roles: ROLES.bench, name: 'marking the repair done' },
  { from: 'repaired', to: 'verified', via: 'patch', roles: ROLES.reviewers, name: 'signing off the repair' },
  { from: 'repaired', to: 'diagnosing', via: 'patch', roles: ROLES.bench, name: 'reopening the diagnosis' },
  { from: 'verified', to: 'returned', via: 'patch', roles: ROLES.bench, name: 'returning the board' },
];

export function jobMove(from: JobStatus, to: JobStatus): JobMove | undefined {
  return JOB_MOVES.find((m) => m.from === from && m.to === to);
}

/** The one move an event makes; the table holds exactly one per event (the policy test checks it). */
export function moveOnEvent(event: MoveEvent): JobMove {
  const move = JOB_MOVES.find((m) => m.events?.includes(event));
  if (!move) throw new Error(`No job move happens on ${event}`);
  return move;
}

/** May someone in `role` move a job from `from` to `to` (through `via`, if given)? */
export function mayMove(from: JobStatus, to: JobStatus, role: Role | null | undefined, via?: MoveVia): boolean {
  const m = jobMove(from, to);
  return !!m && hasRole(role, m.roles) && (!via || m.via === via);
}

/** The statuses someone in `role` may move a job to from `from`, in the table's order. */
export function allowedMoves(from: JobStatus, role: Role | null | undefined, via?: MoveVia): JobStatus[] {
  return JOB_MOVES.filter((m) => m.from === from && mayMove(from, m.to, role, via)).map((m) => m.to);
}

const READINGS_OPEN: Record<ReadingPhase, readonly JobStatus[]> = {
  diagnosis: ['received', 'diagnosing'],
  verification: ['approved', 'repaired'],
};

/** The statuses in which a job takes readings of a phase (the SQL that stores readings is built from this). */
export const statusesTakingReadings = (phase: ReadingPhase): readonly JobStatus[] => READINGS_OPEN[phase];

export const acceptsReadings = (status: JobStatus, phase: ReadingPhase): boolean => READINGS_OPEN[phase].includes(status);

/**
 * Why `role` may not record a reading of `phase` on a job, or null when it may. Trainees take guided diagnosis
 * steps on their own jobs only; verification after a repair is a technician's.
 */
export function readingRefusal(role: Role, phase: ReadingPhase, assignedToThem: boolean): string | null {
  if (role !== 'trainee') return null;
  if (!assignedToThem) return 'Trainees record readings only on jobs assigned to them';
  if (phase !== 'diagnosis') return 'Trainees take diagnosis steps; verification readings after a repair are taken by a technician';
  return null;
}

/** Roles that may lift guided order for a trainee (on one job, or on all of a trainee's jobs): their reviewers. */
export const guidedLiftRoles: readonly Role[] = ROLES.reviewers;

/** Where guided order has been lifted: on this job, and/or for the trainee across all their jobs. */
export interface GuidedLift {
  job: boolean;
  trainee: boolean;
}

/**
 * Whether readings must follow the engine's guided order for this person: a trainee works in guided order only,
 * until a lead lifts it for the job or for that trainee on all their jobs. Everyone else works freely.
 */
export function guidedOrderBinds(role: Role, lift: GuidedLift): boolean {
  return role === 'trainee' && !lift.job && !lift.trainee;
}

/** Whether this person may lift (or restore) guided order, for a job or for a trainee. */
export const canLiftGuidedOrder = (role: Role | null | undefined): boolean => hasRole(role, guidedLiftRoles);

/** Why guided order cannot be lifted for this person, or null when it can: only trainees work under it. */
export function traineeLiftRefusal(targetRole: Role): string | null {
  return targetRole === 'trainee' ? null : 'Guided order binds trainees only: this person already works without it';
}

/** A part may be proposed for review from a received job too: proposing starts the diagnosis first. */
export function canPropose(status: JobStatus, role: Role | null | undefined): boolean {
  if (mayMove(status, 'awaiting-review', role, 'patch')) return true;
  return status === 'received' && mayMove('received', 'diagnosing', role, 'patch') && mayMove('diagnosing', 'awaiting-review', role, 'patch');
}

export const canApprove = (status: JobStatus, role: Role | null | undefined): boolean => mayMove(status, 'approved', role, 'review');

export const canSignOff = (status: JobStatus, role: Role | null | undefined): boolean => mayMove(status, 'verified', role, 'patch');

/** Quotes, invoices and status mails: the bench; trainees read them. */
export const canBill = (role: Role | null | undefined): boolean => hasRole(role, ROLES.bench);

const REPORT_READY: readonly JobStatus[] = ['verified', 'returned'];

/** The repair report goes to the customer once the repair is signed off. */
export const reportReady = (status: JobStatus): boolean => REPORT_READY.includes(status);

/** Who may take readings through a bench meter: everyone who takes readings (the reading write applies its own rules). */
export const benchMeterRoles: readonly Role[] = ROLES.everyone;
export const mayUseBenchMeter = (role: Role | null | undefined): boolean => hasRole(role, benchMeterRoles);

/**
 * A request is served only by a bridge signed in as the person who asked for it, in their shop: the reading is
 * theirs, under their role's rules. Anyone else's bridge is told there is no such request.
 */
export const mayServeBenchMeterArm = (actor: { id: string; shopId: string }, arm: { userId: string; shopId: string }): boolean =>
  actor.id === arm.userId && actor.shopId === arm.shopId;
