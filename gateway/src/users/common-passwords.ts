import { dictionary } from '@zxcvbn-ts/language-common';

let list: ReadonlySet<string> | undefined;

/**
 * The shipped list of common passwords: @zxcvbn-ts/language-common's "passwords-common"
 * (about 49,000 entries, all lower-case, from public breach corpora). Loaded on first use.
 */
export function isCommonPassword(lowercased: string): boolean {
  list ??= new Set(dictionary['passwords-common']);
  return list.has(lowercased);
}

export function commonPasswordCount(): number {
  list ??= new Set(dictionary['passwords-common']);
  return list.size;
}
