import { describe, expect, it } from 'vitest';
import { browserOf } from './session-text';

describe('browserOf', () => {
  it('names the browser and system of common user agents', () => {
    expect(
      browserOf(
        'Mozilla/5.0 (X11; Linux x86_64) AppleWebKit/537.36 (KHTML, like Gecko) Chrome/140.0.0.0 Safari/537.36',
      ),
    ).toBe('Chrome on Linux');
    expect(
      browserOf('Mozilla/5.0 (Windows NT 10.0; Win64; x64; rv:128.0) Gecko/20100101 Firefox/128.0'),
    ).toBe('Firefox on Windows');
    expect(browserOf(null)).toBe('unknown browser');
    expect(browserOf('curl/8.5.0')).toBe('curl/8.5.0');
  });
});
