import { dictionary } from '@zxcvbn-ts/language-common';
import { AppError } from '../http/errors';

export const MIN_PASSWORD_LENGTH = 10;

// The 49,000 most common passwords of leaked lists, as the zxcvbn-ts project ships them (NIST SP 800-63B §5.1.1.2:
// refuse passwords known to be commonly used). Built once, on first use.
let common: Set<string> | undefined;
const commonPasswords = () => (common ??= new Set((dictionary as Record<string, string[]>)['passwords-common']!.map((p) => p.toLowerCase())));

/** Why a password is refused, or null when it passes: long enough, not common, not the person's e-mail. */
export function passwordProblem(password: string, email?: string): string | null {
  if ([...password].length < MIN_PASSWORD_LENGTH) return `use at least ${MIN_PASSWORD_LENGTH} characters`;
  const lower = password.toLowerCase();
  if (commonPasswords().has(lower)) return 'this password is on a list of commonly used passwords; choose another';
  if (email && (lower === email.toLowerCase() || lower === email.split('@')[0]!.toLowerCase())) return 'do not use your e-mail address as the password';
  return null;
}

export function assertPasswordAllowed(password: string, email?: string): void {
  const problem = passwordProblem(password, email);
  if (problem) throw new AppError('invalid', `Password: ${problem}`, { errors: [{ path: 'password', message: problem }] });
}
