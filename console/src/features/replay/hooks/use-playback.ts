import { useEffect, useState } from 'react';
import { advance, clamp, STEP_MS, type Playback, type Speed } from '../utils/playback';

const FRAME_MS = 100;

interface State extends Playback {
  /** the window this state belongs to: a new window starts at its beginning, paused */
  window: string;
}

/**
 * The replay's transport: a cursor in site time that moves at `speed` site seconds per wall
 * second while playing, and can be paused, stepped and set (scrub, or a click on an entry).
 */
export function usePlayback(fromMs: number, toMs: number) {
  const window = `${fromMs}-${toMs}`;
  const [state, setState] = useState<State>({
    window,
    cursorMs: fromMs,
    playing: false,
    speed: 360,
  });
  const fresh = (s: State): State =>
    s.window === window ? s : { ...s, window, cursorMs: fromMs, playing: false };
  const p = fresh(state);
  const update = (f: (s: State) => State) => setState((prev) => f(fresh(prev)));

  useEffect(() => {
    if (!p.playing) return undefined;
    let last = performance.now();
    const timer = setInterval(() => {
      const now = performance.now();
      const elapsed = now - last;
      last = now;
      setState((prev) =>
        prev.window === window ? { ...prev, ...advance(prev, elapsed, toMs) } : prev,
      );
    }, FRAME_MS);
    return () => clearInterval(timer);
  }, [p.playing, toMs, window]);

  const seek = (ms: number) => update((s) => ({ ...s, cursorMs: clamp(ms, fromMs, toMs) }));
  const step = (direction: 1 | -1) =>
    update((s) => ({
      ...s,
      playing: false,
      cursorMs: clamp(s.cursorMs + direction * STEP_MS, fromMs, toMs),
    }));
  const setPlaying = (playing: boolean) =>
    update((s) => ({
      ...s,
      playing,
      // playing again from the end starts over
      cursorMs: playing && s.cursorMs >= toMs ? fromMs : s.cursorMs,
    }));
  const setSpeed = (speed: Speed) => setState((s) => ({ ...s, speed }));

  return {
    cursorMs: p.cursorMs,
    playing: p.playing,
    speed: p.speed,
    seek,
    step,
    setPlaying,
    setSpeed,
  };
}
