import { passwordWeakness } from '../../shared/api/password-policy';
import { LIMITS } from '../../shared/limits';

/** The password rules in a sentence, shown under every field where a password is chosen. */
export const PASSWORD_RULES_HINT = `At least ${LIMITS.minPasswordLength} characters, 5 or more different ones, not a common password and not your e-mail.`;

/** Why a chosen password breaks the rules, worded for the field labelled `label`; null when it is fine. */
export function passwordProblem(password: string, email: string | undefined, label = 'Password'): string | null {
  const weakness = passwordWeakness(password, email);
  return weakness ? `${label} ${weakness}` : null;
}
