import type { Quality } from '@stillwell/shared/telemetry';
import type { Severity } from '../../lib/severity';
import { ink, signal } from '../../theme';

/** Text colour for a value: grey when normal, colour only when it needs attention. */
export function severityColor(severity: Severity): string {
  switch (severity) {
    case 'alarm':
      return signal.alarm;
    case 'caution':
      return signal.caution;
    default:
      return ink.primary;
  }
}

/** Doubt about the data outranks its severity: a doubtful number is not read as a sound one. */
export function valueColor(severity: Severity, stale: boolean, quality: Quality | null): string {
  if (stale || quality !== 'good') return signal.doubt;
  return severityColor(severity);
}
