/**
 * Whether a password is too weak for an administrator account created from the command line.
 * The first rule is the one every new password on the site follows (`NewPasswordSchema`); the
 * others refuse what an attacker tries first (common practice): the published demo passwords, the
 * account's own address, one character repeated, a run along the keyboard or the alphabet.
 */
import { NewPasswordSchema } from '@shared/api/auth';
import { DEMO_ACCOUNTS } from '../db/demoAccounts';

const RUNS = ['abcdefghijklmnopqrstuvwxyz', '01234567890', 'qwertyuiopasdfghjklzxcvbnm', '1qaz2wsx3edc4rfv5tgb6yhn7ujm8ik9ol0p'];
const FEWEST_DISTINCT_CHARACTERS = 5;

/** Why the password is refused, as the end of "The password is too weak: …"; null when it is fine. */
export function weakPasswordReason(password: string, email: string): string | null {
  const shape = NewPasswordSchema.safeParse(password);
  if (!shape.success) return shape.error.issues[0]?.message ?? 'it does not meet the password rules';
  const lower = password.toLowerCase();
  if (DEMO_ACCOUNTS.some((a) => a.password === password)) return 'it is one of the demo passwords printed in the README';
  const namePart = email.split('@')[0]!.toLowerCase();
  if (namePart.length >= 3 && lower.includes(namePart)) return 'it contains the name part of the e-mail address';
  if (new Set(password).size < FEWEST_DISTINCT_CHARACTERS) return `it has fewer than ${FEWEST_DISTINCT_CHARACTERS} different characters`;
  if (isRun(lower)) return 'it is a run of keys or letters (like "1234567890" or "qwertyuiop")';
  return null;
}

/** The whole password is a stretch of one of the runs, forwards or backwards. */
function isRun(lower: string): boolean {
  const reversed = [...lower].reverse().join('');
  return RUNS.some((run) => run.includes(lower) || run.includes(reversed));
}
