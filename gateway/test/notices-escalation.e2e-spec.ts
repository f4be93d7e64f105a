import type { MyRelease, Notice } from '@stillwell/shared/notices';
import { EscalationService } from '../src/notices/escalation.service';
import { signInAs } from './support/auth';
import {
  api,
  entries,
  prepare,
  RESERVOIR,
  setSiteTime,
  startNoticesRig,
  T0,
  type NoticesRig,
} from './support/notices';

const MIN = 60_000;

/** Escalation windows on the site clock, moved by hand; the stakeholder's own view and acknowledgement. */
describe('downstream notices: silence, escalation and the stakeholder view', () => {
  let rig: NoticesRig;
  let escalation: EscalationService;
  const board = async (orderId: string) =>
    (
      await api(rig.gateway, rig.liaison)
        .get(`/api/reservoirs/${RESERVOIR}/notices?orderId=${orderId}`)
        .expect(200)
    ).body as Notice[];
  const standings = async (orderId: string, zone: string) =>
    (await board(orderId))
      .find((n) => n.zoneName === zone)!
      .recipients.map((r) => `${r.person}:${r.standing}`);

  beforeAll(async () => {
    rig = await startNoticesRig();
    escalation = rig.gateway.app.get(EscalationService);
  });
  afterAll(() => rig?.stop());

  it('escalates a silent contact to the next in the chain when their window has run, not before', async () => {
    const [arnsey] = (await prepare(rig, 'order-quiet', 450)).filter(
      (n) => n.zoneName === 'Arnsey Mill',
    );
    await api(rig.gateway, rig.liaison).post(`/api/notices/${arnsey!.id}/send`).expect(200);
    expect(await standings('order-quiet', 'Arnsey Mill')).toEqual(['Wenna Trask:told']);

    setSiteTime(rig.gateway, T0 + 30 * MIN - 1000);
    expect(await escalation.tick()).toBe(0);
    expect(await standings('order-quiet', 'Arnsey Mill')).toEqual(['Wenna Trask:told']);

    setSiteTime(rig.gateway, T0 + 30 * MIN);
    expect(await escalation.tick()).toBe(1);
    expect(await standings('order-quiet', 'Arnsey Mill')).toEqual([
      'Wenna Trask:silent',
      'Col Bastable:told',
    ]);
    const [entry] = await entries(rig.gateway, 'notice.escalated');
    expect(entry!.payload).toMatchObject({
      person: 'Wenna Trask',
      why: 'silent',
      silentForS: 1800,
      endOfChain: false,
    });

    // escalated once only; at the end of the chain the silence is still recorded, with nobody left to mail
    expect(await escalation.tick()).toBe(0);
    setSiteTime(rig.gateway, T0 + 60 * MIN);
    await escalation.tick();
    const last = (await entries(rig.gateway, 'notice.escalated')).at(-1)!;
    expect(last.payload).toMatchObject({
      person: 'Col Bastable',
      endOfChain: true,
      toContactIds: [],
    });
    expect(await standings('order-quiet', 'Arnsey Mill')).toEqual([
      'Wenna Trask:silent',
      'Col Bastable:silent',
    ]);
  });

  it('does not escalate someone who acknowledged in time', async () => {
    setSiteTime(rig.gateway, T0 + 2 * 60 * MIN);
    const [hessford] = (await prepare(rig, 'order-heard', 900)).filter(
      (n) => n.zoneName === 'Hessford',
    );
    await api(rig.gateway, rig.liaison).post(`/api/notices/${hessford!.id}/send`).expect(200);

    const stakeholder = await signInAs(rig.gateway, 'stakeholder');
    const mine = (await api(rig.gateway, stakeholder).get('/api/notices/mine').expect(200))
      .body as MyRelease[];
    const release = mine.find((m) => m.noticeId === hessford!.id)!;
    expect(release).toMatchObject({
      zoneName: 'Hessford',
      phase: 'upcoming',
      acknowledgedAt: null,
      releaseM3s: 900,
    });
    expect(release.message).toContain('Expected release: 900 m3/s');
    const ack = await api(rig.gateway, stakeholder)
      .post(`/api/notices/mine/${release.recipientId}/acknowledge`)
      .expect(200);
    expect(ack.body.recorded).toBe(true);
    const again = await api(rig.gateway, stakeholder)
      .post(`/api/notices/mine/${release.recipientId}/acknowledge`)
      .expect(200);
    expect(again.body.recorded).toBe(false);

    setSiteTime(rig.gateway, T0 + 4 * 60 * MIN);
    await escalation.tick();
    expect(await standings('order-heard', 'Hessford')).toEqual(['Dorran Pike:acknowledged']);
    const acks = (await entries(rig.gateway, 'notice.acknowledged')).filter(
      (e) => e.payload.noticeId === hessford!.id,
    );
    expect(acks.map((a) => [a.payload.via, a.actorName])).toEqual([['console', 'stakeholder']]);
  });

  it("refuses a stakeholder acknowledging someone else's notice", async () => {
    const notices = await board('order-quiet');
    const wenna = notices
      .find((n) => n.zoneName === 'Arnsey Mill')!
      .recipients.find((r) => r.person === 'Wenna Trask')!;
    const stakeholder = await signInAs(rig.gateway, 'stakeholder');
    await api(rig.gateway, stakeholder)
      .post(`/api/notices/mine/${wenna.id}/acknowledge`)
      .expect(403);
  });
});
