// Rules of the bench that the server enforces and the screens follow, written once. Pure functions only.
import type { Role } from './auth';

/** Roles that may lift guided order for a trainee's job: the people who review a trainee's work. */
export const guidedLiftRoles: readonly Role[] = ['admin', 'lead'];

/**
 * Whether readings on this job must follow the engine's guided order for this person: a trainee works in guided
 * order only, until a lead lifts it for the job.
 */
export function guidedOrderBinds(role: Role, liftedBy: string | null | undefined): boolean {
  return role === 'trainee' && !liftedBy;
}

/** Whether this person may lift (or restore) guided order on a job. */
export const canLiftGuidedOrder = (role: Role) => guidedLiftRoles.includes(role);

/** How a returned board left the shop. */
export const returnMethods = ['courier', 'collected'] as const;
export type ReturnMethod = (typeof returnMethods)[number];
export const returnMethodLabels: Record<ReturnMethod, string> = { courier: 'sent by courier', collected: 'collected by the customer' };
