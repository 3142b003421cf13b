import { z } from 'zod';

export const roles = ['admin', 'lead', 'tech', 'trainee'] as const;
export const roleSchema = z.enum(roles);
export type Role = z.infer<typeof roleSchema>;
/** The roles as screens and e-mails name them. */
export const roleLabels: Record<Role, string> = { admin: 'Shop admin', lead: 'Lead', tech: 'Technician', trainee: 'Trainee' };

export const signInRequest = z.object({
  email: z.string().trim().toLowerCase().email().max(254),
  password: z.string().min(1).max(200),
});
export type SignInRequest = z.infer<typeof signInRequest>;

export const meResponse = z.object({
  id: z.string(),
  email: z.string(),
  name: z.string(),
  role: roleSchema,
  shopId: z.string(),
  shopName: z.string(),
});
export type Me = z.infer<typeof meResponse>;

/** Who is signed in, if anyone: 200 either way, so a signed-out page load logs no error. */
export const sessionResponse = z.object({ user: meResponse.nullable() });
export type SessionInfo = z.infer<typeof sessionResponse>;
