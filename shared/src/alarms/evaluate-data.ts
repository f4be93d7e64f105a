import type { Verdict } from './detector.js';
import type { EngineState, Judgement } from './engine-state.js';

const minutes = (ms: number) => `${Math.round(ms / 60_000)} min`;

/**
 * Silence: one alarm per device with a stale channel, and one for the whole feed when nothing at
 * all has been heard for longer than the shortest stale limit. While the whole feed is silent the
 * per-device alarms are held back (suppressed by design): a lost link would otherwise raise one
 * alarm per device at once, a flood that says less than the single alarm does.
 *
 * A device is judged against the newest reading of the feed, not the clock: when the whole feed
 * arrives late (a busy gateway, a site clock running hundreds of times faster than the wall) no
 * device is singled out; that lateness is the whole-feed alarm's business.
 */
export function evaluateSilence(s: EngineState, nowMs: number): Judgement[] {
  const channels = [...s.channels.values()];
  const shortest = Math.min(...channels.map((c) => c.staleAfterS)) * 1000;
  const newest = s.newest();
  const heard = Math.max(newest ?? -Infinity, s.feedAliveAt, s.silenceFromMs);
  const quiet = nowMs - heard;
  const silent = quiet > shortest;
  const out: Judgement[] = [
    {
      id: 'telemetry-silent',
      verdict: silent ? 'set' : 'reset',
      value: quiet / 1000,
      limit: shortest / 1000,
      message: silent
        ? `nothing heard from any instrument for ${minutes(quiet)}`
        : 'instruments reporting',
    },
  ];
  const reference = Math.min(nowMs, Math.max(newest ?? s.silenceFromMs, s.silenceFromMs));
  const devices = new Map<string, typeof channels>();
  for (const c of channels) devices.set(c.deviceId, [...(devices.get(c.deviceId) ?? []), c]);
  for (const [device, list] of devices) {
    const age = (id: string) => s.silentFor(id, reference);
    const stale = list.filter((c) => age(c.id) > c.staleAfterS * 1000);
    let verdict: Verdict = stale.length ? 'set' : 'reset';
    if (silent) verdict = 'deadband';
    out.push({
      id: `stale.${device}`,
      verdict,
      value: stale.length ? Math.max(...stale.map((c) => age(c.id))) / 1000 : null,
      limit: null,
      message: stale.length
        ? `stale: ${stale.map((c) => `${c.id} (${minutes(age(c.id))})`).join(', ')}`
        : `${device} reporting`,
    });
  }
  return out;
}

/**
 * Frozen: a healthy instrument's reading wanders a little; one that stays within `band` of a
 * value for `afterS` is stuck, even if it still says its reading is good.
 */
export function evaluateFrozen(s: EngineState, nowMs: number): Judgement[] {
  return s.settings.frozen.map((f) => {
    const track = s.frozen.get(f.channel);
    const fresh = s.fresh(f.channel, nowMs);
    const still = track ? track.lastT - track.since : null;
    let verdict: Verdict = 'unknown';
    // a stale channel has its own alarm; whether it is frozen cannot be told
    if (fresh && still !== null) verdict = still >= f.afterS * 1000 ? 'set' : 'reset';
    return {
      id: `frozen.${f.channel}`,
      verdict,
      value: still === null ? null : still / 1000,
      limit: f.afterS,
      message:
        track && still !== null
          ? `${f.channel} within ${f.band} of ${track.ref} for ${minutes(still)}`
          : `${f.channel}: no good readings`,
    };
  });
}

/** A burst of out-of-range messages for one channel (the quarantine's 'out-of-range' reason). */
export function evaluateOutOfRange(s: EngineState, nowMs: number): Judgement[] {
  const o = s.settings.outOfRange;
  return [...s.channels.keys()].map((channel) => {
    const times = s.rejects.get(channel) ?? [];
    const recent = times.filter((t) => t > nowMs - o.windowS * 1000 && t <= nowMs).length;
    const latest = times[times.length - 1];
    let verdict: Verdict = 'deadband';
    if (recent >= o.count) verdict = 'set';
    else if (latest === undefined || nowMs - latest > o.clearAfterS * 1000) verdict = 'reset';
    return {
      id: `out-of-range.${channel}`,
      verdict,
      value: recent,
      limit: o.count,
      message: `${recent} out-of-range messages in ${minutes(o.windowS * 1000)}`,
    };
  });
}
