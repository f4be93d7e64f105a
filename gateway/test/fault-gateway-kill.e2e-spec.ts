import { sleep } from './support/processes';
import { Storm } from './support/storm';

jest.setTimeout(300_000);

describe('fault: the gateway is SIGKILLed mid-storm and restarted on the same database', () => {
  let storm: Storm | undefined;

  afterAll(async () => {
    await storm?.stop();
  });

  it('stores every reading every device produced exactly once, and the logbook verifies', async () => {
    storm = await Storm.start();
    try {
      const before = await storm.storedMoreThan(500);
      storm.gateway.child.signal('SIGKILL');
      await storm.gateway.child.exited;
      expect(storm.gateway.child.child.signalCode).toBe('SIGKILL');
      // the storm goes on: the broker queues for the gateway's session, devices keep numbering
      await sleep(3000);
      await storm.startGateway();
      await storm.storedMoreThan(before + 1000);
      const { ledger, duplicates, logbook, gaps, produced } = await storm.finish();
      expect(Object.keys(gaps).filter((state) => state !== 'filled')).toEqual([]);
      expect(produced).toBeGreaterThan(before + 1000);
      expect(ledger.every((d) => d.lost === 0 && d.overrunUnsent === 0)).toBe(true);
      expect(duplicates).toEqual([]);
      expect(logbook.ok).toBe(true);
      expect(logbook.count).toBeGreaterThan(0);
    } catch (error) {
      throw new Error(`${(error as Error).message}\n${storm.outputs()}`, { cause: error });
    }
  });
});
