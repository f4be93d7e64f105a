import type { Contact, ImportResult, Zone } from '@stillwell/shared/notices';
import { signInAs } from './support/auth';
import { api, entries, RESERVOIR, startNoticesRig, type NoticesRig } from './support/notices';

describe('downstream registry: zones, contacts, CSV import', () => {
  let rig: NoticesRig;
  beforeAll(async () => {
    rig = await startNoticesRig();
  });
  afterAll(() => rig?.stop());

  it('seeds the invented demo downstream, nearest zone first', async () => {
    const zones = (
      await api(rig.gateway, rig.liaison).get(`/api/reservoirs/${RESERVOIR}/zones`).expect(200)
    ).body as Zone[];
    expect(zones.map((z) => [z.name, z.distanceM, z.contactCount])).toEqual([
      ['Quarry Road construction site', 1500, 2],
      ['Arnsey Mill', 3000, 2],
      ['Hessford', 14000, 2],
      ['Tamsel Mouth campground', 22000, 2],
    ]);
    const contacts = (
      await api(rig.gateway, rig.liaison).get(`/api/reservoirs/${RESERVOIR}/contacts`).expect(200)
    ).body as Contact[];
    expect(contacts.find((c) => c.person === 'Dorran Pike')).toMatchObject({
      username: 'stakeholder',
      leadTimeS: 7200,
    });
  });

  it('refuses a travel-time table out of order, naming the row; zones are kept by the engineer and the liaison (notices.manage)', async () => {
    const engineer = await signInAs(rig.gateway, 'engineer');
    const operator = await signInAs(rig.gateway, 'operator');
    const zone = {
      name: 'Fenner Weir footpath',
      kind: 'other',
      distanceM: 6000,
      affectedAtM3s: 300,
      travelTimes: [
        { releaseM3s: 100, travelTimeS: 5400 },
        { releaseM3s: 50, travelTimeS: 3600 },
      ],
    };
    const bad = await api(rig.gateway, engineer)
      .post(`/api/reservoirs/${RESERVOIR}/zones`, zone)
      .expect(400);
    expect(bad.body.message).toEqual([
      'travelTimes.1.releaseM3s: must be greater than the row above (100 m3/s)',
    ]);
    const good = { ...zone, travelTimes: [...zone.travelTimes].reverse() };
    await api(rig.gateway, operator).post(`/api/reservoirs/${RESERVOIR}/zones`, good).expect(403);
    const made = await api(rig.gateway, engineer)
      .post(`/api/reservoirs/${RESERVOIR}/zones`, good)
      .expect(201);
    // the liaison may correct it (say, the threshold), and it is the same zone afterwards
    const edited = await api(rig.gateway, rig.liaison)
      .put(`/api/reservoirs/${RESERVOIR}/zones/${made.body.id}`, { ...good, affectedAtM3s: 320 })
      .expect(200);
    expect(edited.body).toMatchObject({ id: made.body.id, affectedAtM3s: 320 });
  });

  it('imports a CSV all or nothing, with every problem by row and column', async () => {
    const header =
      'zone,organisation,person,role,email,phone,lead_time_min,escalation_order,ack_window_min,username';
    const csv = [
      header,
      'Hessford,Hessford Rowing Club,Mo Kettering,captain,captain@hessford-rowing.example,+44 1632 960 310,60,3,20,',
      'Nowhere,Hessford Rowing Club,Ann Other,coach,coach@hessford-rowing.example,+44 1632 960 311,60,3,20,',
      'Hessford,Hessford Rowing Club,Ann Other,coach,coach-at-rowing,+44 1632 960 311,60,3,20,nobody',
    ].join('\n');
    const refused = (
      await api(rig.gateway, rig.liaison)
        .post(`/api/reservoirs/${RESERVOIR}/contacts/import`, { csv })
        .expect(200)
    ).body as ImportResult;
    expect(refused.imported).toBe(0);
    expect(refused.problems.map((p) => p.message)).toEqual([
      `row 3, column 'zone': no zone "Nowhere" (zones: Quarry Road construction site, Arnsey Mill, Fenner Weir footpath, Hessford, Tamsel Mouth campground)`,
      `row 4, column 'email': not an e-mail address ("coach-at-rowing")`,
    ]);
    const lines = csv.split('\n');
    const second = [
      lines[0],
      lines[1],
      lines[3]!.replace('coach-at-rowing', 'coach@hessford-rowing.example'),
    ].join('\n');
    const still = (
      await api(rig.gateway, rig.liaison)
        .post(`/api/reservoirs/${RESERVOIR}/contacts/import`, { csv: second })
        .expect(200)
    ).body as ImportResult;
    expect(still.problems.map((p) => p.message)).toEqual([
      `row 3, column 'username': no stakeholder account "nobody"`,
    ]);
    const fixed = second.replace(',nobody', ',stakeholder');
    const ok = (
      await api(rig.gateway, rig.liaison)
        .post(`/api/reservoirs/${RESERVOIR}/contacts/import`, { csv: fixed })
        .expect(200)
    ).body as ImportResult;
    expect(ok).toEqual({ imported: 2, problems: [] });
    expect((await entries(rig.gateway, 'contacts.imported')).at(-1)!.payload).toMatchObject({
      count: 2,
    });
  });
});
