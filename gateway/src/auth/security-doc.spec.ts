import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { permissionTableMarkdown } from '@stillwell/shared/access';

const DOC = join(__dirname, '../../../docs/security.md');

describe('docs/security.md', () => {
  it('prints exactly the permission matrix of @stillwell/shared/access (so they cannot drift)', () => {
    const doc = readFileSync(DOC, 'utf8');
    const block =
      /<!-- permission-matrix:start -->\n([\s\S]*?)\n<!-- permission-matrix:end -->/.exec(doc);
    expect(block).not.toBeNull();
    expect(block![1]).toBe(permissionTableMarkdown());
  });
});
