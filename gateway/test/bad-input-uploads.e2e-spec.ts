import { existsSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { apiErrorSchema } from '@stillwell/shared/http';
import type { LogbookEntry } from '@stillwell/shared/logbook';
import { ACCESS_TEST_ENV, signInAs, type SignedInUser } from './support/auth';
import { startTestBroker, type TestBroker } from './support/broker';
import { startTestGateway, type TestGateway } from './support/gateway';
import { snapshot } from './fuzz-snapshot';

// a 1x1 PNG, as a camera or an editor would make it
const PNG = Buffer.from(
  'iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNkYPhfDwAChwGA60e6kgAAAABJRU5ErkJggg==',
  'base64',
);

/** A multipart/form-data body built byte by byte (RFC 7578), so the file name goes out exactly as given. */
function multipart(
  fields: Record<string, string>,
  file?: { name: Buffer; type: string; bytes: Buffer },
) {
  const boundary = `----stillwell${Date.now()}`;
  const parts: Buffer[] = [];
  for (const [k, v] of Object.entries(fields))
    parts.push(
      Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="${k}"\r\n\r\n${v}\r\n`),
    );
  if (file) {
    parts.push(
      Buffer.concat([
        Buffer.from(
          `--${boundary}\r\nContent-Disposition: form-data; name="attachments"; filename="`,
        ),
        file.name,
        Buffer.from(`"\r\nContent-Type: ${file.type}\r\n\r\n`),
        file.bytes,
        Buffer.from('\r\n'),
      ]),
    );
  }
  parts.push(Buffer.from(`--${boundary}--\r\n`));
  return { body: Buffer.concat(parts), type: `multipart/form-data; boundary=${boundary}` };
}

describe('upload names with path tricks, and broken uploads: nothing reaches the file system by name', () => {
  let broker: TestBroker;
  let gateway: TestGateway;
  let operator: SignedInUser;
  const root = () => join(gateway.databasePath, '..');
  const attachmentsDir = () => join(root(), 'attachments');
  const upload = async (form: { body: Buffer; type: string }) => {
    const res = await fetch(`${gateway.url}/api/logbook/shift-notes`, {
      method: 'POST',
      headers: { Authorization: `Bearer ${operator.token}`, 'Content-Type': form.type },
      body: new Uint8Array(form.body),
    });
    return { status: res.status, body: (await res.json()) as unknown };
  };

  beforeAll(async () => {
    broker = await startTestBroker();
    gateway = await startTestGateway({ ...ACCESS_TEST_ENV, MQTT_URL: broker.url });
    operator = await signInAs(gateway, 'operator');
    // the first upload makes the attachments folder: done here, so each case sees a settled tree
    const first = await upload(
      multipart(
        { text: 'first' },
        { name: Buffer.from('first.png'), type: 'image/png', bytes: PNG },
      ),
    );
    expect(first.status).toBe(201);
  });

  afterAll(async () => {
    await gateway?.close();
    await broker?.stop();
  });

  it.each([
    ['../../../etc/passwd.png'],
    ['/etc/passwd.png'],
    ['C:\\Windows\\System32\\evil.png'],
    ['..\\..\\evil.png'],
    ['....//....//evil.png'],
    ['%2e%2e%2fevil.png'],
    ['.htaccess'],
    ['\u202egnp.exe'],
    ['..'],
  ])('stores %j under its hash only, with a safe display name', async (name) => {
    const before = readdirSync(root()).sort();
    const bytes = Buffer.concat([PNG, Buffer.from(name)]); // distinct bytes per case
    const res = await upload(
      multipart({ text: 'name trick' }, { name: Buffer.from(name), type: 'image/png', bytes }),
    );
    expect(res.status).toBe(201);
    const [ref] = (res.body as LogbookEntry).payload.attachments as Array<{
      name: string;
      sha256: string;
    }>;
    // the display name: one segment, no separators, NUL or control characters, no leading dot
    const shown = ref!.name;
    expect(shown.length).toBeGreaterThan(0);
    expect(shown.startsWith('.')).toBe(false);
    expect([...shown].filter((ch) => '/\\\u202e'.includes(ch) || ch.charCodeAt(0) < 0x20)).toEqual(
      [],
    );
    expect(readdirSync(root()).sort()).toEqual(before);
    expect(readdirSync(attachmentsDir()).every((f) => /^[0-9a-f]{64}$/.test(f))).toBe(true);
    expect(readdirSync(attachmentsDir())).toContain(ref!.sha256);
    expect(existsSync(join(root(), '..', 'evil.png'))).toBe(false);
  });

  it('refuses a name with a NUL byte with 400 (the part header is malformed), and stores nothing', async () => {
    const before = snapshot(gateway.databasePath);
    const res = await upload(
      multipart(
        { text: 'nul' },
        { name: Buffer.from('evil\u0000.png'), type: 'image/png', bytes: PNG },
      ),
    );
    expect(res.status).toBe(400);
    expect(apiErrorSchema.parse(res.body).message).toMatch(/Malformed part header/);
    expect(snapshot(gateway.databasePath)).toEqual(before);
  });

  it.each([
    [
      'a file whose bytes are not what it declares',
      Buffer.from('#!/bin/sh\nrm -rf /\n'),
      'image/png',
      /attachments\.0 .*content is not one of/,
    ],
    ['an empty file', Buffer.alloc(0), 'image/png', /attachments\.0 .*empty/],
  ])(
    'refuses %s with 400 naming the attachment, and stores nothing',
    async (_what, bytes, type, reason) => {
      const before = snapshot(gateway.databasePath);
      const files = readdirSync(attachmentsDir()).sort();
      const res = await upload(
        multipart({ text: 'bad file' }, { name: Buffer.from('x.png'), type, bytes }),
      );
      expect(res.status).toBe(400);
      expect(([] as string[]).concat(apiErrorSchema.parse(res.body).message).join(' ')).toMatch(
        reason,
      );
      expect(snapshot(gateway.databasePath)).toEqual(before);
      expect(readdirSync(attachmentsDir()).sort()).toEqual(files);
    },
  );

  it('refuses a multipart body whose boundary never closes with 400, and stores nothing', async () => {
    const before = snapshot(gateway.databasePath);
    const form = multipart(
      { text: 'cut short' },
      { name: Buffer.from('x.png'), type: 'image/png', bytes: PNG },
    );
    const res = await upload({
      body: form.body.subarray(0, form.body.length - 40),
      type: form.type,
    });
    expect(res.status).toBe(400);
    expect(apiErrorSchema.safeParse(res.body).success).toBe(true);
    expect(snapshot(gateway.databasePath)).toEqual(before);
  });
});
