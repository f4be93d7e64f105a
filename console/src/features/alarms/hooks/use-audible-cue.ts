import { useCallback, useEffect, useRef, useSyncExternalStore } from 'react';
import type { AlarmView } from '@stillwell/shared/alarms';

export const ALARM_SOUND_STORAGE_KEY = 'stillwell.alarmSound';

const listeners = new Set<() => void>();
/** where the browser refuses storage, the choice lasts the tab */
let unstored = false;

function readSetting(): boolean {
  try {
    return localStorage.getItem(ALARM_SOUND_STORAGE_KEY) === 'on';
  } catch {
    return unstored;
  }
}

function subscribe(listener: () => void): () => void {
  listeners.add(listener);
  const onStorage = (e: StorageEvent) => {
    if (e.key === ALARM_SOUND_STORAGE_KEY) listener();
  };
  window.addEventListener('storage', onStorage);
  return () => {
    listeners.delete(listener);
    window.removeEventListener('storage', onStorage);
  };
}

let context: AudioContext | null = null;

/**
 * The browser lets a page make sound only after a gesture: the context is made (or resumed) when
 * the operator switches the cue on, so that later alarms can sound without one.
 */
function audio(): AudioContext | null {
  const Ctor = (window as { AudioContext?: typeof AudioContext }).AudioContext;
  if (!Ctor) return null;
  context ??= new Ctor();
  if (context.state === 'suspended') void context.resume();
  return context;
}

/**
 * The cue: two short falling tones, repeated once. Its own pattern, not a siren or any standard
 * evacuation tone, so it is not mistaken for a site-wide alarm.
 */
export function beep(): void {
  const ctx = audio();
  if (!ctx) return;
  const start = ctx.currentTime + 0.02;
  [0, 0.5].forEach((offset) =>
    [880, 660].forEach((freq, i) => {
      const osc = ctx.createOscillator();
      const gain = ctx.createGain();
      const t = start + offset + i * 0.18;
      osc.frequency.value = freq;
      gain.gain.setValueAtTime(0.0001, t);
      gain.gain.exponentialRampToValueAtTime(0.2, t + 0.02);
      gain.gain.exponentialRampToValueAtTime(0.0001, t + 0.16);
      osc.connect(gain).connect(ctx.destination);
      osc.start(t);
      osc.stop(t + 0.17);
    }),
  );
}

export function setAlarmSound(on: boolean): void {
  unstored = on;
  try {
    localStorage.setItem(ALARM_SOUND_STORAGE_KEY, on ? 'on' : 'off');
  } catch {
    // not remembered past this tab
  }
  if (on) audio();
  listeners.forEach((l) => l());
}

/** Whether the audible cue is on (off by default), remembered in this browser. */
export function useAlarmSound(): [boolean, (on: boolean) => void] {
  const on = useSyncExternalStore(subscribe, readSetting, () => false);
  const set = useCallback((next: boolean) => setAlarmSound(next), []);
  return [on, set];
}

/** The cue is for high-priority alarms that are new: raised, in service, not yet acknowledged. */
export function cueKey(a: AlarmView): string | null {
  if (a.priority !== 'immediate' || a.handling !== 'in-service' || a.acknowledged || !a.active)
    return null;
  return `${a.conditionId}@${a.raisedAtMs ?? a.lastChangeMs}`;
}

/**
 * Sounds the cue once for each new immediate alarm. What is already there when the screen opens
 * is not new (a reload must not sound again); each alarm sounds once however often it is fetched.
 */
export function useAudibleCue(
  alarms: readonly AlarmView[] | undefined,
  play: () => void = beep,
): void {
  const [on] = useAlarmSound();
  const seen = useRef<Set<string> | null>(null);
  useEffect(() => {
    if (!alarms) return;
    const keys = alarms.map(cueKey).filter((k): k is string => k !== null);
    if (seen.current === null) {
      seen.current = new Set(keys);
      return;
    }
    const fresh = keys.filter((k) => !seen.current!.has(k));
    for (const k of fresh) seen.current.add(k);
    if (fresh.length > 0 && on) play();
  }, [alarms, on, play]);
}
