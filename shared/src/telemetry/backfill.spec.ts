import { describe, expect, it } from 'vitest';
import { backfillReplySchema, backfillRequestSchema } from './backfill.js';
import { backfillReplyTopic, backfillTopic, parseTopic } from './topics.js';

describe('backfill messages', () => {
  it('spells and reads back the request and reply topics', () => {
    expect(backfillTopic('lake-orrin', 'pool-radar')).toBe(
      'stillwell/v1/lake-orrin/backfill/pool-radar',
    );
    expect(parseTopic(backfillReplyTopic('lake-orrin', 'pool-radar'))).toEqual({
      kind: 'backfill-reply',
      reservoirId: 'lake-orrin',
      deviceId: 'pool-radar',
    });
    expect(parseTopic('stillwell/v1/lake-orrin/backfill/pool-radar')?.kind).toBe('backfill');
    expect(parseTopic('stillwell/v1/lake-orrin/backfill-other/pool-radar')).toBeNull();
  });

  it('accepts a range and refuses one that runs backwards or is not whole numbers', () => {
    expect(backfillRequestSchema.safeParse({ requestId: 'g1', fromSeq: 3, toSeq: 3 }).success).toBe(
      true,
    );
    expect(backfillRequestSchema.safeParse({ requestId: 'g1', fromSeq: 4, toSeq: 3 }).success).toBe(
      false,
    );
    expect(
      backfillRequestSchema.safeParse({ requestId: 'g1', fromSeq: 1.5, toSeq: 3 }).success,
    ).toBe(false);
    expect(
      backfillRequestSchema.safeParse({ requestId: 'g1', fromSeq: 1, toSeq: 3, x: 1 }).success,
    ).toBe(false);
  });

  it('reads a reply with the parts the device no longer holds', () => {
    const reply = {
      requestId: 'g1',
      fromSeq: 0,
      toSeq: 99,
      resent: 60,
      unavailable: [{ fromSeq: 0, toSeq: 39, reason: 'overrun' }],
    };
    expect(backfillReplySchema.parse(reply)).toEqual(reply);
    const bad = { ...reply, unavailable: [{ fromSeq: 0, toSeq: 39, reason: 'tired' }] };
    expect(backfillReplySchema.safeParse(bad).success).toBe(false);
  });
});
