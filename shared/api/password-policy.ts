import { LIMITS } from '../limits';

/** A handful of passwords too common to allow (common practice: refuse the most-guessed). */
const COMMON = new Set([
  'password', 'password1', 'password123', '1234567890', '12345678910', 'qwertyuiop', 'iloveyou12', 'letmein123',
  'welcome123', 'administrator', 'passw0rd12', 'abcdefghij', '0123456789', 'qwerty1234', 'football12',
]);

/**
 * Why a password is too weak, or null when it is acceptable: long enough, not one of the most
 * common, not mostly one character, and not the e-mail address or its name part.
 */
export function passwordWeakness(password: string, email?: string): string | null {
  if (password.length < LIMITS.minPasswordLength) return `must be at least ${LIMITS.minPasswordLength} characters`;
  if (password.length > LIMITS.maxPasswordLength) return `must be at most ${LIMITS.maxPasswordLength} characters`;
  const lower = password.toLowerCase();
  if (COMMON.has(lower)) return 'is one of the most common passwords; choose another';
  if (new Set(lower).size < 5) return 'must use at least 5 different characters';
  if (email) {
    const address = email.toLowerCase();
    const name = address.split('@')[0];
    if (lower === address || (name.length >= 4 && lower.includes(name))) return 'must not contain your e-mail address';
  }
  return null;
}
