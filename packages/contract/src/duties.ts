// Separation of duties, per shop: whether the person who proposed a diagnosis may also approve it, and who
// may correct a reading someone else took. The server refuses by these functions; screens call the same ones.
import { z } from 'zod';
import { roleSchema, type Role } from './auth';
import { roleRank } from './policy';

export const dutyRulesSchema = z.object({
  /** The proposer of a diagnosis may approve it too (a one-person shop); off by default: a second pair of eyes. */
  selfApproval: z.boolean(),
  /** The lowest role that may correct (supersede) a reading another person took. */
  correctOthersMinRole: roleSchema,
});
export type DutyRules = z.infer<typeof dutyRulesSchema>;

export const DEFAULT_DUTY_RULES: DutyRules = { selfApproval: false, correctOthersMinRole: 'lead' };

export const updateDutyRulesRequest = dutyRulesSchema.partial().refine((o) => Object.keys(o).length > 0, 'nothing to change');
export type UpdateDutyRulesRequest = z.input<typeof updateDutyRulesRequest>;

/** Why this person may not approve the diagnosis `proposerId` proposed, or null when they may. */
export function approvalRefusal(rules: DutyRules, actorId: string, proposerId: string | null): string | null {
  if (rules.selfApproval || proposerId === null || proposerId !== actorId) return null;
  return 'You proposed this diagnosis: another lead or admin approves it (the shop asks for a second person)';
}

/** Why this person may not correct a reading `authorId` took, or null when they may (their own always). */
export function correctionRefusal(rules: DutyRules, actor: { id: string; role: Role }, authorId: string): string | null {
  if (actor.id === authorId || roleRank(actor.role) >= roleRank(rules.correctOthersMinRole)) return null;
  return `Correcting a reading someone else took needs a ${rules.correctOthersMinRole} or above in this shop`;
}
