import { z } from 'zod';

/**
 * Password rules after NIST SP 800-63B (5.1.1.2, memorized secrets): a length floor and ceiling,
 * no composition rules, no forced periodic change, and a check against common and context-specific
 * passwords. Length counts Unicode code points after NFKC normalisation, as the hash sees them.
 */
export const PASSWORD_RULES = {
  minLength: 8,
  /** holders of the admin role can change every account, so their floor is higher */
  adminMinLength: 15,
  maxLength: 128,
} as const;

export const PASSWORD_PROBLEMS = [
  'too-short',
  'too-long',
  'common',
  'repetitive',
  'contains-username',
  'context-word',
] as const;
export type PasswordProblem = (typeof PASSWORD_PROBLEMS)[number];
export const passwordProblemSchema = z.enum(PASSWORD_PROBLEMS);

export const PASSWORD_PROBLEM_MESSAGES: Readonly<Record<PasswordProblem, string>> = {
  'too-short': 'too short',
  'too-long': `longer than ${PASSWORD_RULES.maxLength} characters`,
  common: 'on the list of commonly used passwords',
  repetitive: 'one character repeated, or a simple run like 12345678 or abcdefgh',
  'contains-username': 'contains the username',
  'context-word': 'contains the name of this system',
};

export interface PasswordContext {
  /** the roles of the account the password is for (admin raises the floor) */
  roles?: readonly string[];
  username?: string;
  /** the shipped common-password list; the gateway always passes it, a form may not have it */
  isCommon?: (lowercased: string) => boolean;
}

/** The form every password is hashed and compared in. */
export function normalizePassword(password: string): string {
  return password.normalize('NFKC');
}

export function passwordLength(password: string): number {
  return [...normalizePassword(password)].length;
}

export function minPasswordLength(roles: readonly string[] = []): number {
  return roles.includes('admin') ? PASSWORD_RULES.adminMinLength : PASSWORD_RULES.minLength;
}

const CONTEXT_WORDS = ['stillwell'];

function isRepetitiveOrRun(chars: readonly string[]): boolean {
  if (chars.length < 2) return false;
  const codes = chars.map((c) => c.codePointAt(0) ?? 0);
  const step = codes[1]! - codes[0]!;
  if (Math.abs(step) > 1) return false;
  return codes.every((c, i) => i === 0 || c - codes[i - 1]! === step);
}

/** Every rule the password breaks; empty when it is acceptable. */
export function checkPassword(password: string, context: PasswordContext = {}): PasswordProblem[] {
  const normalized = normalizePassword(password);
  const chars = [...normalized];
  const lower = normalized.toLowerCase();
  const problems: PasswordProblem[] = [];
  if (chars.length < minPasswordLength(context.roles)) problems.push('too-short');
  if (chars.length > PASSWORD_RULES.maxLength) problems.push('too-long');
  if (context.isCommon?.(lower)) problems.push('common');
  if (isRepetitiveOrRun(chars)) problems.push('repetitive');
  const username = context.username?.toLowerCase();
  if (username && username.length >= 4 && lower.includes(username))
    problems.push('contains-username');
  if (CONTEXT_WORDS.some((w) => lower.includes(w))) problems.push('context-word');
  return problems;
}

/** A zod schema for a new password under these rules (for forms; the gateway checks again). */
export function newPasswordSchema(context: PasswordContext = {}) {
  return z.string().superRefine((password, ctx) => {
    for (const problem of checkPassword(password, context)) {
      const message =
        problem === 'too-short'
          ? `at least ${minPasswordLength(context.roles)} characters`
          : PASSWORD_PROBLEM_MESSAGES[problem];
      ctx.addIssue({ code: 'custom', message, params: { problem } });
    }
  });
}
