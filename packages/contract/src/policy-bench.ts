// How a board leaves the shop, in the words the screens and the report use. (The rules of who may do what are
// in policy.ts.)
/** How a returned board left the shop. */
export const returnMethods = ['courier', 'collected'] as const;
export type ReturnMethod = (typeof returnMethods)[number];
export const returnMethodLabels: Record<ReturnMethod, string> = { courier: 'sent by courier', collected: 'collected by the customer' };
