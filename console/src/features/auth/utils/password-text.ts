import {
  minPasswordLength,
  passwordProblemSchema,
  PASSWORD_PROBLEM_MESSAGES,
  PASSWORD_RULES,
  type PasswordProblem,
} from '@stillwell/shared/access';
import { ApiError } from '../../../lib/api-client';

/** A rule in the words the form shows (the same words as newPasswordSchema's). */
export function problemText(problem: PasswordProblem, roles: readonly string[]): string {
  return problem === 'too-short'
    ? `at least ${minPasswordLength(roles)} characters`
    : PASSWORD_PROBLEM_MESSAGES[problem];
}

/** The rules the gateway says a new password broke (password-rejected), in those words. */
export function rejectedPasswordText(error: unknown, roles: readonly string[]): string | null {
  if (!(error instanceof ApiError) || error.code !== 'password-rejected') return null;
  const problems = (error.body as { problems?: unknown } | undefined)?.problems;
  const list = Array.isArray(problems)
    ? problems.flatMap((p) => {
        const parsed = passwordProblemSchema.safeParse(p);
        return parsed.success ? [problemText(parsed.data, roles)] : [];
      })
    : [];
  return list.length ? list.join('; ') : error.message;
}

/** The rule as one line for a form's helper text. */
export function passwordRuleHint(roles: readonly string[]): string {
  return `At least ${minPasswordLength(roles)} characters (at most ${PASSWORD_RULES.maxLength}); a phrase of several words works well. Not a commonly used password.`;
}
