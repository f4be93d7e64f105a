import { simpleParser } from 'mailparser';
import request from 'supertest';
import type { Notice } from '@stillwell/shared/notices';
import { OutboxService } from '../src/mail/outbox.service';
import { AckLinks } from '../src/notices/ack-links';
import { EscalationService } from '../src/notices/escalation.service';
import { signInAs } from './support/auth';
import {
  api,
  entries,
  prepare,
  RESERVOIR,
  startNoticesRig,
  T0,
  type NoticesRig,
} from './support/notices';

/**
 * Notices through a real SMTP server on loopback (the demo mail server, smtp-server), read back
 * with mailparser as a mail client would, and the personal acknowledgement link followed.
 */
describe('downstream notices by mail', () => {
  let rig: NoticesRig;
  let hessford: Notice;
  let link: string;

  beforeAll(async () => {
    rig = await startNoticesRig();
  });
  afterAll(async () => {
    await rig?.stop();
  });

  const raw = async (to: string) => {
    const outbox = rig.gateway.app.get(OutboxService);
    const message = (await outbox.list()).find((m) => m.to.includes(to));
    if (!message) throw new Error(`nothing in the outbox for ${to}`);
    return simpleParser((await outbox.raw(message.id))!);
  };

  it('prepares a notice for each zone whose threshold the release reaches, with its figures', async () => {
    const notices = await prepare(rig, 'order-800', 800, {
      currentReleaseM3s: 40,
      durationS: 6 * 3600,
    });
    expect(notices.map((n) => n.zoneName).sort()).toEqual([
      'Arnsey Mill',
      'Hessford',
      'Quarry Road construction site',
      'Tamsel Mouth campground',
    ]);
    hessford = notices.find((n) => n.zoneName === 'Hessford')!;
    // 800 m3/s lies 30% of the way from 500 (2.5 h) to 1500 (1.5 h) in Hessford's table
    expect(hessford.travelTimeS).toBe(7920);
    // the longest first-call lead time of the order is the campground's 3 h
    expect(hessford.startAt).toBe(T0 + 3 * 3600_000);
    expect(hessford.arrivalAt).toBe(hessford.startAt + 7920_000);
    expect(hessford.state).toBe('prepared');
    expect(hessford.recipients.map((r) => [r.person, r.standing])).toEqual([
      ['Dorran Pike', 'waiting'],
    ]);
    expect(await prepare(rig, 'order-300', 300)).toHaveLength(2);
  });

  it('refuses a template with a misspelt placeholder, naming the field', async () => {
    const res = await api(rig.gateway, rig.liaison)
      .put(`/api/notices/${hessford.id}/wording`, {
        subject: hessford.subject,
        template: 'Arrives {{arival}}',
      })
      .expect(400);
    expect((res.body as { message: string[] }).message[0]).toMatch(
      /^template: unknown placeholder \{\{arival\}\}/,
    );
  });

  it('sends the mail; the SMTP server accepts it; it carries the release figures and a personal link', async () => {
    await api(rig.gateway, rig.liaison)
      .put(`/api/notices/${hessford.id}/wording`, {
        subject: hessford.subject,
        template: 'Dear {{person}}: about {{release}} from {{dam}}, at {{zone}} by {{arrival}}.',
      })
      .expect(200);
    const res = await api(rig.gateway, rig.liaison)
      .post(`/api/notices/${hessford.id}/send`)
      .expect(200);
    const sent = res.body as Notice;
    expect(sent.state).toBe('sent');
    expect(sent.recipients[0]).toMatchObject({
      delivery: 'delivered',
      standing: 'told',
      deliveredAt: expect.any(Number),
    });

    const mail = await raw('duty.officer@hessford-em.example');
    expect(mail.to && !Array.isArray(mail.to) ? mail.to.text : '').toBe(
      'duty.officer@hessford-em.example',
    );
    expect(mail.subject).toMatch(
      /^Release notice: Orrin Gap Dam to about 800 m3\/s \(28,252 cfs\), reaching Hessford/,
    );
    const text = mail.text ?? '';
    expect(text).toContain(
      'Dear Dorran Pike: about 800 m3/s (28,252 cfs) from Orrin Gap Dam, at Hessford by Tue 1 Dec 2026, 15:12 GMT.',
    );
    expect(text).toContain('Expected release: 800 m3/s (28,252 cfs)');
    expect(text).toContain('Release starts at the dam: Tue 1 Dec 2026, 13:00 GMT');
    expect(text).toContain(
      'Expected arrival at Hessford (14 km downstream): Tue 1 Dec 2026, 15:12 GMT',
    );
    expect(text).toContain('High flow at Hessford lasting: 6 h');
    expect(mail.headers.get('x-stillwell-recipient')).toBe(sent.recipients[0]!.id);
    link = /https?:\/\/\S+\/api\/notices\/ack\/\S+/.exec(text)?.[0] ?? '';
    expect(link).not.toBe('');

    const kinds = (
      await entries(rig.gateway, 'notice.prepared', 'notice.sent', 'notice.delivered')
    ).map((e) => e.kind);
    expect(kinds.filter((k) => k === 'notice.sent')).toHaveLength(1);
    expect(kinds).toContain('notice.delivered');
  });

  it('records the acknowledgement once when the link is opened; opening it again is harmless', async () => {
    const path = new URL(link).pathname;
    const first = await request(rig.gateway.url).get(path).expect(200);
    expect(first.headers['content-type']).toMatch(/text\/html/);
    expect(first.text).toContain('Thank you, Dorran Pike. Your acknowledgement was recorded');
    const again = await request(rig.gateway.url).get(path).expect(200);
    expect(again.text).toContain('was already acknowledged');

    const acks = await entries(rig.gateway, 'notice.acknowledged');
    expect(acks).toHaveLength(1);
    expect(acks[0]!.payload).toMatchObject({
      person: 'Dorran Pike',
      via: 'link',
      noticeId: hessford.id,
    });
    const board = await api(rig.gateway, rig.liaison)
      .get(`/api/reservoirs/${RESERVOIR}/notices?orderId=order-800`)
      .expect(200);
    const row = (board.body as Notice[]).find((n) => n.id === hessford.id)!;
    expect(row.recipients[0]).toMatchObject({ standing: 'acknowledged', acknowledgedVia: 'link' });
  });

  it('refuses a forged link and an expired one with a plain page, and records nothing', async () => {
    const path = new URL(link).pathname;
    const token = path.split('/').pop()!;
    const [v, body, sig] = token.split('.') as [string, string, string];
    const forgedSig = `${v}.${body}.${sig.startsWith('A') ? 'B' : 'A'}${sig.slice(1)}`;
    const forged = await request(rig.gateway.url).get(`/api/notices/ack/${forgedSig}`).expect(400);
    expect(forged.text).toContain('This acknowledgement link is not valid');
    // a body changed to someone else's recipient id, with the old signature
    const otherBody = Buffer.from(
      JSON.stringify({ r: 'someone-else', e: Date.now() + 1e9 }),
    ).toString('base64url');
    await request(rig.gateway.url).get(`/api/notices/ack/${v}.${otherBody}.${sig}`).expect(400);
    await request(rig.gateway.url).get('/api/notices/ack/not-a-token').expect(400);

    const links = rig.gateway.app.get(AckLinks);
    const recipientId = JSON.parse(Buffer.from(body, 'base64url').toString()) as { r: string };
    const old = links.sign(recipientId.r, Date.now() - 73 * 3_600_000);
    const expired = await request(rig.gateway.url).get(`/api/notices/ack/${old.token}`).expect(410);
    expect(expired.text).toContain('This acknowledgement link has expired');
    expect(await entries(rig.gateway, 'notice.acknowledged')).toHaveLength(1);
  });

  it('records a bounce when the mail server refuses the address, and escalates it at once', async () => {
    const zones = (
      await api(rig.gateway, rig.liaison).get(`/api/reservoirs/${RESERVOIR}/zones`).expect(200)
    ).body as Array<{ id: string; name: string }>;
    const arnsey = zones.find((z) => z.name === 'Arnsey Mill')!;
    await api(rig.gateway, rig.liaison)
      .post(`/api/reservoirs/${RESERVOIR}/contacts`, {
        zoneId: arnsey.id,
        organisation: 'Arnsey Mill Allotments',
        person: 'Nobody Home',
        role: 'secretary',
        email: 'secretary@arnsey-allotments.invalid',
        phone: '+44 1632 960 299',
        leadTimeS: 600,
        escalationOrder: 1,
        ackWindowS: 1800,
        userId: null,
        active: true,
      })
      .expect(201);
    const [notice] = (await prepare(rig, 'order-450', 450)).filter(
      (n) => n.zoneName === 'Arnsey Mill',
    );
    const sent = (
      await api(rig.gateway, rig.liaison).post(`/api/notices/${notice!.id}/send`).expect(200)
    ).body as Notice;
    const nobody = sent.recipients.find((r) => r.person === 'Nobody Home')!;
    expect(nobody).toMatchObject({ delivery: 'bounced', standing: 'bounced' });
    expect(nobody.bounceReason).toMatch(/550|does not exist/);
    const bounces = await entries(rig.gateway, 'notice.bounced');
    expect(bounces.map((b) => b.payload.email)).toEqual(['secretary@arnsey-allotments.invalid']);

    expect(await rig.gateway.app.get(EscalationService).tick()).toBe(1);
    const after = (
      await api(rig.gateway, rig.liaison)
        .get(`/api/reservoirs/${RESERVOIR}/notices?orderId=order-450`)
        .expect(200)
    ).body as Notice[];
    const persons = after
      .find((n) => n.id === notice!.id)!
      .recipients.map((r) => `${r.person}:${r.reason}:${r.delivery}`);
    expect(persons).toContain('Col Bastable:escalation:delivered');
    const escalated = await entries(rig.gateway, 'notice.escalated');
    expect(escalated.at(-1)!.payload).toMatchObject({ person: 'Nobody Home', why: 'bounced' });
  });

  it('shows a stakeholder only their own zones and themselves on the board, and the registry to its keeper only', async () => {
    const stakeholder = await signInAs(rig.gateway, 'stakeholder');
    const theirs = (
      await api(rig.gateway, stakeholder).get(`/api/reservoirs/${RESERVOIR}/notices`).expect(200)
    ).body as Notice[];
    expect(new Set(theirs.map((n) => n.zoneName))).toEqual(new Set(['Hessford']));
    expect(theirs.flatMap((n) => n.recipients.map((r) => r.person))).toEqual(['Dorran Pike']);
    const operator = await signInAs(rig.gateway, 'operator');
    await api(rig.gateway, operator).get(`/api/reservoirs/${RESERVOIR}/contacts`).expect(403);
    await api(rig.gateway, operator).get(`/api/reservoirs/${RESERVOIR}/notices`).expect(200);
  });

  it('lets the liaison and the duty engineer send a notice, never the operator (notices.send)', async () => {
    const notices = await prepare(rig, 'order-who-sends', 800);
    const [first, second] = notices.filter((n) => n.state === 'prepared');
    expect(first && second).toBeTruthy();
    const operator = await signInAs(rig.gateway, 'operator');
    const refused = await api(rig.gateway, operator)
      .post(`/api/notices/${first!.id}/send`)
      .expect(403);
    expect(refused.body.code).toBe('forbidden');
    // and the operator does not prepare or reword them either (notices.manage)
    await api(rig.gateway, operator)
      .post(`/api/reservoirs/${RESERVOIR}/notices/prepare`, {
        orderId: 'order-by-operator',
        targetReleaseM3s: 800,
        currentReleaseM3s: 40,
        plannedStartAt: null,
        durationS: null,
      })
      .expect(403);
    const engineer = await signInAs(rig.gateway, 'engineer');
    const sent = (
      await api(rig.gateway, engineer).post(`/api/notices/${first!.id}/send`).expect(200)
    ).body as Notice;
    expect(sent.state).toBe('sent');
    const byLiaison = (
      await api(rig.gateway, rig.liaison).post(`/api/notices/${second!.id}/send`).expect(200)
    ).body as Notice;
    expect(byLiaison.state).toBe('sent');
    const sentEntries = (await entries(rig.gateway, 'notice.sent')).filter((e) =>
      [first!.id, second!.id].includes(e.payload.noticeId as string),
    );
    expect(sentEntries.map((e) => e.actorName).sort()).toEqual(['engineer', 'liaison']);
  });
});
