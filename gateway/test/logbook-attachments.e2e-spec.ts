import { createHash } from 'node:crypto';
import { existsSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import request from 'supertest';
import type { LogbookEntry, VerificationReport } from '@stillwell/shared/logbook';
import { ACCESS_TEST_ENV, signInAs, type SignedInUser } from './support/auth';
import { startTestBroker, type TestBroker } from './support/broker';
import { startTestGateway, type TestGateway } from './support/gateway';

// a 1x1 PNG and a minimal PDF: real files, as a camera or a scanner would make them
const PNG = Buffer.from(
  'iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNkYPhfDwAChwGA60e6kgAAAABJRU5ErkJggg==',
  'base64',
);
const PDF = Buffer.from('%PDF-1.4\n1 0 obj <<>> endobj\ntrailer <<>>\n%%EOF\n');
const sha = (b: Buffer) => createHash('sha256').update(b).digest('hex');

describe('logbook: shift log, attachments, export, filters', () => {
  let broker: TestBroker;
  let gateway: TestGateway;
  let operator: SignedInUser;
  let reviewer: SignedInUser;
  const attachmentsDir = () => join(gateway.databasePath, '..', 'attachments');

  beforeAll(async () => {
    broker = await startTestBroker();
    gateway = await startTestGateway({
      ...ACCESS_TEST_ENV,
      MQTT_URL: broker.url,
      ORDER_TICK_MS: '0',
      FORECAST_TICK_MS: '0',
    });
    operator = await signInAs(gateway, 'operator');
    reviewer = await signInAs(gateway, 'reviewer');
  });
  afterAll(async () => {
    await gateway?.close();
    await broker?.stop();
  });

  const as = (u: SignedInUser) => ({
    get: (path: string) =>
      request(gateway.url).get(`/api${path}`).set('Authorization', `Bearer ${u.token}`),
    post: (path: string) =>
      request(gateway.url).post(`/api${path}`).set('Authorization', `Bearer ${u.token}`),
  });

  it('keeps a shift note with a photo and a PDF under their SHA-256, named in the payload', async () => {
    const res = await as(operator)
      .post('/logbook/shift-notes')
      .field('text', 'Gate 2 seal weeping at the left trunnion; photo and inspection note attached')
      .field('controls', 'gate-2')
      .attach('attachments', PNG, { filename: 'gate2-seal.png', contentType: 'image/png' })
      .attach('attachments', PDF, { filename: 'inspection.pdf', contentType: 'application/pdf' })
      .expect(201);
    const entry = res.body as LogbookEntry;
    expect(entry).toMatchObject({ kind: 'shift.note', actorName: 'operator' });
    expect(entry.payload.attachments).toEqual([
      { sha256: sha(PNG), name: 'gate2-seal.png', mediaType: 'image/png', size: PNG.length },
      { sha256: sha(PDF), name: 'inspection.pdf', mediaType: 'application/pdf', size: PDF.length },
    ]);
    expect(readFileSync(join(attachmentsDir(), sha(PNG)))).toEqual(PNG);
    const back = await as(reviewer)
      .get(`/logbook/entries/${entry.seq}/attachments/${sha(PDF)}`)
      .expect(200);
    expect(back.headers['content-type']).toMatch(/application\/pdf/);
    expect(back.headers['content-disposition']).toMatch(/^attachment; filename="inspection.pdf"/);
    expect(Buffer.from(back.body as Buffer)).toEqual(PDF);
  });

  it('reads the type from the bytes, not from the name or the declared type', async () => {
    const html = Buffer.from('<html><script>alert(1)</script></html>');
    const fake = await as(operator)
      .post('/logbook/shift-notes')
      .field('text', 'photo')
      .attach('attachments', html, { filename: 'photo.png', contentType: 'image/png' })
      .expect(400);
    expect(fake.body.message).toMatch(
      /attachments\.0 \("photo\.png"\): its content is not one of JPEG photo, PNG image, PDF document/,
    );
    const lying = await as(operator)
      .post('/logbook/shift-notes')
      .field('text', 'photo')
      .attach('attachments', PDF, { filename: 'scan.jpg', contentType: 'image/jpeg' })
      .expect(400);
    expect(lying.body.message).toMatch(/declared image\/jpeg, but its content is PDF document/);
  });

  it('refuses a file over the size limit, naming the limit', async () => {
    const big = Buffer.concat([PNG, Buffer.alloc(10 * 1024 * 1024)]);
    const res = await as(operator)
      .post('/logbook/shift-notes')
      .field('text', 'big')
      .attach('attachments', big, { filename: 'big.png', contentType: 'image/png' });
    expect(res.status).toBe(413);
    expect(res.body.message).toMatch(/at most 10 MB each/);
  });

  it('is safe against path tricks in names: only the hash names the file', async () => {
    const before = readdirSync(join(gateway.databasePath, '..'));
    const bytes = Buffer.concat([PNG, Buffer.from('different bytes')]);
    const res = await as(operator)
      .post('/logbook/shift-notes')
      .field('text', 'tricky name')
      .attach('attachments', bytes, { filename: '../../../evil.png', contentType: 'image/png' })
      .expect(201);
    const [ref] = (res.body as LogbookEntry).payload.attachments as Array<{
      name: string;
      sha256: string;
    }>;
    expect(ref!.name).toBe('evil.png');
    expect(readdirSync(join(gateway.databasePath, '..'))).toEqual(before);
    expect(existsSync(join(gateway.databasePath, '..', '..', 'evil.png'))).toBe(false);
    expect(readdirSync(attachmentsDir())).toContain(ref!.sha256);
    expect(readdirSync(attachmentsDir()).every((f) => /^[0-9a-f]{64}$/.test(f))).toBe(true);
    await as(reviewer)
      .get(`/logbook/entries/${(res.body as LogbookEntry).seq}/attachments/..%2F..%2Fetc`)
      .expect(400);
  });

  it('records a handover: who hands over to whom', async () => {
    const res = await as(operator)
      .post('/logbook/handovers')
      .field('to', 'Jory Penwith (night shift)')
      .field(
        'text',
        'Pool 205.2 m and rising 4 cm/h; gate 1 at 1 m under order; notices to Hessford sent',
      )
      .expect(201);
    expect(res.body).toMatchObject({
      kind: 'shift.handover',
      payload: { from: 'operator', to: 'Jory Penwith (night shift)' },
    });
    const refused = await as(reviewer)
      .post('/logbook/handovers')
      .field('to', 'x')
      .field('text', 'y');
    expect([refused.status, refused.body.code]).toEqual([403, 'forbidden']);
    const empty = await as(operator).post('/logbook/handovers').field('to', 'Jory').expect(400);
    expect(empty.body.message).toMatch(/text: /);
  });

  it('filters by gate and kind, and exports the filtered range as CSV with the hashed payload', async () => {
    const byGate = await as(reviewer).get('/logbook?gate=gate-2').expect(200);
    expect(byGate.body.rows.map((e: LogbookEntry) => e.kind)).toEqual(['shift.note']);
    expect((await as(reviewer).get('/logbook?gate=gate-1').expect(200)).body.rows).toEqual([]);
    const csv = await as(reviewer).get('/logbook/export?kind=shift.').expect(200);
    expect(csv.headers['content-type']).toMatch(/text\/csv/);
    const lines = (csv.text as string).trim().split('\r\n');
    expect(lines[0]).toBe(
      '"seq","time","kind","actor","roles","controls","payload","prev_hash","hash"',
    );
    expect(lines.slice(1).map((l) => l.split('","')[2])).toEqual([
      'shift.note',
      'shift.note',
      'shift.handover',
    ]);
  });

  it('finds an attachment whose bytes were changed on disk', async () => {
    const clean = (await as(reviewer).get('/logbook/verify').expect(200))
      .body as VerificationReport;
    expect(clean).toMatchObject({ ok: true, attachments: { checked: 3, bad: [] } });
    const file = join(attachmentsDir(), sha(PDF));
    writeFileSync(file, Buffer.from('%PDF-1.4\n(quietly edited inspection result)\n%%EOF\n'));
    const report = (await as(reviewer).get('/logbook/verify').expect(200))
      .body as VerificationReport;
    expect(report.ok).toBe(false);
    expect(report.firstBad).toBeUndefined();
    expect(report.attachments!.bad).toEqual([
      expect.objectContaining({
        sha256: sha(PDF),
        problem: 'altered',
        detail: expect.stringMatching(/bytes were changed/),
      }),
    ]);
  });
});
