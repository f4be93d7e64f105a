import { Storm } from './support/storm';

jest.setTimeout(300_000);

/**
 * aedes keeps sessions in memory: a restarted broker has forgotten the gateway's persistent session
 * and whatever it queued. The devices' store-and-forward and the gateway's backfill cover that.
 */
describe('fault: the broker process is killed mid-storm and started again', () => {
  let storm: Storm | undefined;

  afterAll(async () => {
    await storm?.stop();
  });

  it('stores every reading every device produced exactly once, and the logbook verifies', async () => {
    storm = await Storm.start();
    try {
      const before = await storm.storedMoreThan(500);
      await storm.restartBroker(3000, 'SIGKILL');
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
