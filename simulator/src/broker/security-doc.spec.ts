import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { mosquittoAcl } from './mosquitto.js';

const DOC = fileURLToPath(new URL('../../../docs/security.md', import.meta.url));

describe('docs/security.md', () => {
  it('prints the same Mosquitto acl_file as the broker rules in code (so they cannot drift)', () => {
    const doc = readFileSync(DOC, 'utf8');
    const block =
      /<!-- mosquitto-acl:start -->\n```\n([\s\S]*?)\n```\n<!-- mosquitto-acl:end -->/.exec(doc);
    expect(block, 'the mosquitto-acl block in docs/security.md').not.toBeNull();
    expect(block![1]).toBe(mosquittoAcl('lake-orrin'));
  });
});
