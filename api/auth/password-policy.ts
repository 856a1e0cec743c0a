import type { FieldError } from '@shared/contracts/problem';
import { commonPasswords } from './common-passwords';

/** Length is checked by the zod schema; this adds what a schema cannot know. */
export function passwordProblems(password: string, email: string | null, path = 'password'): FieldError[] {
  const lowered = password.toLowerCase();
  const problems: FieldError[] = [];
  if (commonPasswords.has(lowered)) problems.push({ path, message: 'Password is too common: choose one that is not on the lists of leaked passwords' });
  if (email && lowered === email.toLowerCase()) problems.push({ path, message: 'Password must not be the e-mail address' });
  if (new Set(lowered).size <= 2) problems.push({ path, message: 'Password needs more than two different characters' });
  return problems;
}
