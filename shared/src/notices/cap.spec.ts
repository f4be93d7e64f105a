import { describe, expect, it } from 'vitest';
import { capAlertSchema, capDateTime, capSeverity, capUrgency, CAP_DATETIME } from './cap.js';

describe('OASIS CAP 1.2 vocabulary', () => {
  it('writes date-times as CAP 1.2 3.3.2 wants them: seconds, "-00:00" for UTC, never "Z"', () => {
    const text = capDateTime(Date.parse('2026-12-01T14:05:07.891Z'));
    expect(text).toBe('2026-12-01T14:05:07-00:00');
    expect(CAP_DATETIME.test(text)).toBe(true);
    expect(CAP_DATETIME.test('2026-12-01T14:05:07Z')).toBe(false);
  });

  it('grades urgency by how soon the rise arrives and severity by how far past the threshold', () => {
    const now = 0;
    expect(capUrgency(-1, now)).toBe('Immediate');
    expect(capUrgency(3600_000, now)).toBe('Expected');
    expect(capUrgency(3601_000, now)).toBe('Future');
    expect(capSeverity(500, 400)).toBe('Moderate');
    expect(capSeverity(600, 400)).toBe('Severe');
    expect(capSeverity(1200, 400)).toBe('Extreme');
  });

  it('refuses values outside the CAP 1.2 lists and identifiers with spaces or commas', () => {
    const base = {
      identifier: 'stillwell-lake-orrin-1',
      sender: 'downstream@orrin-gap.example',
      sent: '2026-12-01T14:05:07-00:00',
      status: 'Exercise',
      msgType: 'Alert',
      scope: 'Public',
      info: [
        {
          language: 'en-GB',
          category: ['Met'],
          event: 'Planned dam release',
          responseType: ['Prepare'],
          urgency: 'Future',
          severity: 'Moderate',
          certainty: 'Likely',
          parameter: [],
          area: [{ areaDesc: 'Hessford' }],
        },
      ],
    };
    expect(capAlertSchema.safeParse(base).success).toBe(true);
    expect(capAlertSchema.safeParse({ ...base, status: 'Real' }).success).toBe(false);
    expect(capAlertSchema.safeParse({ ...base, identifier: 'a b' }).success).toBe(false);
    expect(
      capAlertSchema.safeParse({ ...base, info: [{ ...base.info[0], area: [] }] }).success,
    ).toBe(false);
  });
});
