export interface Sample {
  t: number;
  v: number;
}

export interface Spell {
  fromMs: number;
  toMs: number;
  peak: { value: number; timeMs: number };
}

/**
 * Spells from the samples above a level (sorted by time): samples less than `mergeGapMs` apart
 * belong to one spell, so a pool hovering at the level makes one event, not dozens.
 */
export function findHighPoolSpells(samples: readonly Sample[], o: { mergeGapMs: number }): Spell[] {
  const spells: Spell[] = [];
  let cur: Spell | undefined;
  for (const s of samples) {
    if (cur && s.t - cur.toMs <= o.mergeGapMs) {
      cur.toMs = s.t;
      if (s.v > cur.peak.value) cur.peak = { value: s.v, timeMs: s.t };
      continue;
    }
    cur = { fromMs: s.t, toMs: s.t, peak: { value: s.v, timeMs: s.t } };
    spells.push(cur);
  }
  return spells;
}
