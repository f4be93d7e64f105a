import { TestScheduler } from 'rxjs/testing';
import { coalescePerKey } from './coalesce';

/** In the scheduler's virtual time (marble diagrams), so nothing here waits on the clock. */
describe('coalescePerKey', () => {
  const scheduler = () => new TestScheduler((actual, expected) => expect(actual).toEqual(expected));

  it('sends a burst of one key once, at the end of the window its first value opened', () => {
    scheduler().run(({ cold, expectObservable }) => {
      const changes = cold('a 9ms a 9ms a 300ms a', { a: 'lake-orrin' });
      // window from 0 to 250 (three changes), then one from 321 to 571
      expectObservable(coalescePerKey(changes, 250)).toBe('250ms a 320ms a', { a: 'lake-orrin' });
    });
  });

  it('keeps keys apart: each gets its own window', () => {
    scheduler().run(({ cold, expectObservable }) => {
      const changes = cold('a 99ms b 49ms a', { a: 'north', b: 'south' });
      expectObservable(coalescePerKey(changes, 250)).toBe('250ms a 99ms b', {
        a: 'north',
        b: 'south',
      });
    });
  });
});
