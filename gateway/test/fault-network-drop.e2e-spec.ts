import { CuttableLink, sleep, waitFor } from './support/processes';
import { Storm, storedTotal } from './support/storm';

jest.setTimeout(300_000);

/** Wall time the network stays down: at the storm's speed (1800x), 2.5 hours of plant time. */
const DOWN_MS = 5000;

/**
 * The network between every client and the broker drops mid-storm: all sockets are cut and no new
 * one gets through, then it is back. The broker runs on and keeps the gateway's persistent
 * session; the devices keep measuring into their buffers and send them when the link is back.
 */
describe('fault: the network to the broker drops, then comes back', () => {
  let storm: Storm | undefined;
  let link: CuttableLink | undefined;

  afterAll(async () => {
    await storm?.stop();
    await link?.cut();
  });

  it('stores every reading every device produced exactly once, and the logbook verifies', async () => {
    storm = await Storm.start(async (brokerPort) => {
      link = await CuttableLink.open(brokerPort);
      return link.url;
    });
    try {
      const before = await storm.storedMoreThan(500);
      await link!.cut();
      // what was on its way lands within a moment (the count stops moving); then nothing gets through
      const atCut = await waitFor(
        'the count to settle after the cut',
        async () => {
          const first = storedTotal(storm!.databasePath);
          await sleep(1000);
          const second = storedTotal(storm!.databasePath);
          if (second !== first) throw new Error(`${first} -> ${second}`);
          return second;
        },
        30_000,
        0,
      );
      await sleep(DOWN_MS);
      expect(storedTotal(storm.databasePath)).toBe(atCut);
      await link!.mend();
      await storm.storedMoreThan(before + 1000);
      const { ledger, duplicates, logbook, gaps, produced } = await storm.finish();
      expect(produced).toBeGreaterThan(before + 1000);
      expect(ledger.every((d) => d.lost === 0 && d.overrunUnsent === 0)).toBe(true);
      expect(Object.keys(gaps).filter((state) => state !== 'filled')).toEqual([]);
      expect(duplicates).toEqual([]);
      expect(logbook.ok).toBe(true);
    } catch (error) {
      throw new Error(`${(error as Error).message}\n${storm.outputs()}`, { cause: error });
    }
  });
});
