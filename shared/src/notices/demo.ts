import type { ContactInput } from './contacts.js';
import type { ZoneInput } from './zones.js';

const min = 60;
const h = 3600;
const table = (...rows: Array<[number, number]>) =>
  rows.map(([releaseM3s, travelTimeS]) => ({ releaseM3s, travelTimeS }));

/**
 * Lake Orrin's downstream, invented for the demo like the dam itself: the zones below Orrin Gap
 * Dam on the Tamsel River with made-up travel-time tables, and made-up people to tell.
 */
export const DEMO_ZONES: ReadonlyArray<ZoneInput & { key: string }> = [
  {
    key: 'quarry-road',
    name: 'Quarry Road construction site',
    kind: 'work-site',
    distanceM: 1500,
    affectedAtM3s: 150,
    travelTimes: table([100, 25 * min], [500, 12 * min], [1500, 7 * min]),
  },
  {
    key: 'arnsey-mill',
    name: 'Arnsey Mill',
    kind: 'hamlet',
    distanceM: 3000,
    affectedAtM3s: 400,
    travelTimes: table([100, 50 * min], [500, 25 * min], [1500, 15 * min]),
  },
  {
    key: 'hessford',
    name: 'Hessford',
    kind: 'town',
    distanceM: 14_000,
    affectedAtM3s: 700,
    travelTimes: table([100, 5 * h], [500, 2.5 * h], [1500, 1.5 * h]),
  },
  {
    key: 'river-mouth',
    name: 'Tamsel Mouth campground',
    kind: 'campground',
    distanceM: 22_000,
    affectedAtM3s: 250,
    travelTimes: table([100, 8 * h], [500, 4 * h], [1500, 2.5 * h]),
  },
];

export type DemoContact = Omit<ContactInput, 'zoneId' | 'userId'> & {
  zone: string;
  username: string | null;
};

const person = (
  zone: string,
  organisation: string,
  name: string,
  role: string,
  email: string,
  phone: string,
  leadTimeS: number,
  escalationOrder: number,
  username: string | null = null,
): DemoContact => ({
  zone,
  organisation,
  person: name,
  role,
  email,
  phone,
  leadTimeS,
  escalationOrder,
  ackWindowS: 30 * min,
  username,
  active: true,
});

export const DEMO_CONTACTS: readonly DemoContact[] = [
  person(
    'quarry-road',
    'Brackwell Civil Works',
    'Juno Ashgrove',
    'site manager',
    'juno.ashgrove@brackwell-civil.example',
    '+44 1632 960 101',
    1 * h,
    1,
  ),
  person(
    'quarry-road',
    'Brackwell Civil Works',
    'Pell Otterburn',
    'night foreman',
    'pell.otterburn@brackwell-civil.example',
    '+44 1632 960 102',
    1 * h,
    2,
  ),
  person(
    'arnsey-mill',
    'Arnsey Mill Parish Council',
    'Wenna Trask',
    'parish clerk',
    'clerk@arnsey-mill-parish.example',
    '+44 1632 960 201',
    1.5 * h,
    1,
  ),
  person(
    'arnsey-mill',
    'Arnsey Mill Flood Group',
    'Col Bastable',
    'flood warden',
    'warden@arnsey-mill-parish.example',
    '+44 1632 960 202',
    1.5 * h,
    2,
  ),
  person(
    'hessford',
    'Hessford Emergency Management',
    'Dorran Pike',
    'duty officer',
    'duty.officer@hessford-em.example',
    '+44 1632 960 301',
    2 * h,
    1,
    'stakeholder',
  ),
  person(
    'hessford',
    'Hessford Town Council',
    'Alys Fenwick',
    'town clerk',
    'a.fenwick@hessford-town.example',
    '+44 1632 960 302',
    2 * h,
    2,
  ),
  person(
    'river-mouth',
    'Tamsel Mouth Holiday Park',
    'Rook Delaney',
    'site warden',
    'warden@tamsel-mouth-park.example',
    '+44 1632 960 401',
    3 * h,
    1,
  ),
  person(
    'river-mouth',
    'Saltreach Rescue Volunteers',
    'Ivo Marchetti',
    'launch coordinator',
    'launch@saltreach-rescue.example',
    '+44 1632 960 402',
    3 * h,
    2,
  ),
];
