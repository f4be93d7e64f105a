/** How much attention a value asks for; 'normal' is drawn in greys, the others in colour. */
export type Severity = 'normal' | 'caution' | 'alarm';

const RANK: Record<Severity, number> = { normal: 0, caution: 1, alarm: 2 };

export function worse(a: Severity, b: Severity): Severity {
  return RANK[a] >= RANK[b] ? a : b;
}
