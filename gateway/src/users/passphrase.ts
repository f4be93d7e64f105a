import { randomInt } from 'node:crypto';
import { dictionary } from '@zxcvbn-ts/language-common';

/**
 * A random passphrase of words from the EFF long word list (7,776 words, as shipped in
 * @zxcvbn-ts/language-common): 4 words carry about 51.7 bits. For temporary and demo passwords.
 */
export function passphrase(words = 4): string {
  const list = dictionary['diceware-common'];
  return Array.from({ length: words }, () => list[randomInt(list.length)]!).join('-');
}
