import { XMLParser, XMLValidator } from 'fast-xml-parser';
import request from 'supertest';
import type { CapFeed } from '@stillwell/shared/notices';
import { api, prepare, setSiteTime, startNoticesRig, T0, type NoticesRig } from './support/notices';

/*
 * The value lists of OASIS CAP 1.2 (OASIS Standard, 1 July 2010), section 3.2, written out here
 * from the standard rather than imported from the code under test.
 */
const CAP12 = {
  status: ['Actual', 'Exercise', 'System', 'Test', 'Draft'],
  msgType: ['Alert', 'Update', 'Cancel', 'Ack', 'Error'],
  scope: ['Public', 'Restricted', 'Private'],
  category: [
    'Geo',
    'Met',
    'Safety',
    'Security',
    'Rescue',
    'Fire',
    'Health',
    'Env',
    'Transport',
    'Infra',
    'CBRNE',
    'Other',
  ],
  responseType: [
    'Shelter',
    'Evacuate',
    'Prepare',
    'Execute',
    'Avoid',
    'Monitor',
    'Assess',
    'AllClear',
    'None',
  ],
  urgency: ['Immediate', 'Expected', 'Future', 'Past', 'Unknown'],
  severity: ['Extreme', 'Severe', 'Moderate', 'Minor', 'Unknown'],
  certainty: ['Observed', 'Likely', 'Possible', 'Unlikely', 'Unknown'],
};
/** CAP 1.2 3.3.2: "2002-05-24T16:49:00-07:00", no "Z" */
const CAP_TIME = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}[-+]\d{2}:\d{2}$/;
const asList = <T>(v: T | T[] | undefined): T[] =>
  v === undefined ? [] : Array.isArray(v) ? v : [v];

type Node = Record<string, unknown>;

/** Every element CAP 1.2 requires of an <alert>, its <info> and <area>, each value from its list. */
function expectCap12Alert(alert: Node): void {
  expect(alert['@_xmlns']).toBe('urn:oasis:names:tc:emergency:cap:1.2');
  for (const required of ['identifier', 'sender', 'sent', 'status', 'msgType', 'scope']) {
    expect(typeof alert[required]).toBe('string');
  }
  expect(alert.identifier).toMatch(/^[^\s,<&]+$/); // 3.2.1: no spaces, commas or restricted characters
  expect(alert.sender).toMatch(/^[^\s,<&]+$/);
  expect(alert.sent).toMatch(CAP_TIME);
  expect(CAP12.status).toContain(alert.status);
  expect(CAP12.msgType).toContain(alert.msgType);
  expect(CAP12.scope).toContain(alert.scope);
  const infos = asList(alert.info as Node | Node[]);
  expect(infos.length).toBeGreaterThan(0);
  for (const info of infos) {
    const categories = asList(info.category as string | string[]);
    expect(categories.length).toBeGreaterThan(0);
    for (const c of categories) expect(CAP12.category).toContain(c);
    expect(typeof info.event).toBe('string');
    for (const r of asList(info.responseType as string | string[]))
      expect(CAP12.responseType).toContain(r);
    expect(CAP12.urgency).toContain(info.urgency);
    expect(CAP12.severity).toContain(info.severity);
    expect(CAP12.certainty).toContain(info.certainty);
    for (const t of ['onset', 'expires'])
      if (info[t] !== undefined) expect(info[t]).toMatch(CAP_TIME);
    const areas = asList(info.area as Node | Node[]);
    expect(areas.length).toBeGreaterThan(0);
    for (const a of areas) expect(typeof a.areaDesc).toBe('string');
  }
}

describe('the public feed of active release notices (OASIS CAP 1.2)', () => {
  let rig: NoticesRig;
  const parser = new XMLParser({ ignoreAttributes: false, parseTagValue: false });

  beforeAll(async () => {
    rig = await startNoticesRig();
  });
  afterAll(() => rig?.stop());

  it('is empty before anything is sent, and needs no sign-in', async () => {
    const res = await request(rig.gateway.url).get('/api/notices/feed.xml').expect(200);
    expect(res.headers['content-type']).toMatch(/application\/atom\+xml/);
    expect(XMLValidator.validate(res.text)).toBe(true);
    expect(parser.parse(res.text).feed.entry).toBeUndefined();
    expect(
      ((await request(rig.gateway.url).get('/api/notices/feed.json').expect(200)).body as CapFeed)
        .alerts,
    ).toEqual([]);
  });

  it('carries one CAP 1.2 alert per active notice, with every required element and allowed values', async () => {
    const notices = await prepare(rig, 'order-cap', 800, { durationS: 6 * 3600 });
    const hessford = notices.find((n) => n.zoneName === 'Hessford')!;
    const arnsey = notices.find((n) => n.zoneName === 'Arnsey Mill')!;
    for (const n of [hessford, arnsey])
      await api(rig.gateway, rig.liaison).post(`/api/notices/${n.id}/send`).expect(200);

    const res = await request(rig.gateway.url).get('/api/notices/feed.xml').expect(200);
    expect(XMLValidator.validate(res.text)).toBe(true);
    const entries = asList(parser.parse(res.text).feed.entry as Node | Node[]);
    expect(entries).toHaveLength(2);
    for (const entry of entries) {
      expect((entry.content as Node)['@_type']).toBe('application/cap+xml');
      expectCap12Alert((entry.content as Node).alert as Node);
    }
    const alert = entries
      .map((e) => (e.content as Node).alert as Node)
      .find((a) => JSON.stringify(a).includes('Hessford'))!;
    expect(alert).toMatchObject({ status: 'Exercise', msgType: 'Alert', scope: 'Public' }); // demo mode: never Actual
    const info = alert.info as Node;
    expect(info).toMatchObject({
      category: 'Met',
      urgency: 'Future',
      severity: 'Moderate',
      certainty: 'Likely',
    });
    expect(info.onset).toBe('2026-12-01T15:12:00-00:00');
    expect((info.area as Node).areaDesc).toBe(
      'Hessford, 14 km below Orrin Gap Dam on the Tamsel River',
    );

    // the standalone document each entry links to
    const link = asList(entries[0]!.link as Node | Node[])[0]!;
    const path = new URL(link['@_href'] as string).pathname;
    const doc = await request(rig.gateway.url).get(path).expect(200);
    expect(doc.headers['content-type']).toMatch(/application\/cap\+xml/);
    expect(XMLValidator.validate(doc.text)).toBe(true);
    expectCap12Alert(parser.parse(doc.text).alert as Node);

    const json = (await request(rig.gateway.url).get('/api/notices/feed.json').expect(200))
      .body as CapFeed;
    expect(json.alerts.map((a) => a.info[0]!.area[0]!.areaDesc).sort()).toEqual([
      'Arnsey Mill, 3 km below Orrin Gap Dam on the Tamsel River',
      'Hessford, 14 km below Orrin Gap Dam on the Tamsel River',
    ]);
  });

  it('grades urgency as the arrival nears and drops a notice once its high flow has passed', async () => {
    // Hessford's rise arrives at 15:12 and lasts 6 h; Arnsey Mill's at 13:21
    setSiteTime(rig.gateway, Date.parse('2026-12-01T14:30:00Z'));
    const during = (await request(rig.gateway.url).get('/api/notices/feed.json').expect(200))
      .body as CapFeed;
    const urgency = Object.fromEntries(
      during.alerts.map((a) => [a.info[0]!.area[0]!.areaDesc.split(',')[0], a.info[0]!.urgency]),
    );
    expect(urgency).toEqual({ Hessford: 'Expected', 'Arnsey Mill': 'Immediate' });
    setSiteTime(rig.gateway, T0 + 24 * 3600_000);
    expect(
      ((await request(rig.gateway.url).get('/api/notices/feed.json').expect(200)).body as CapFeed)
        .alerts,
    ).toEqual([]);
  });
});
