import { act, render } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import type { AlarmView } from '@stillwell/shared/alarms';
import { makeAlarm } from '../../../testing/alarm-fixtures';
import { ALARM_SOUND_STORAGE_KEY, setAlarmSound, useAudibleCue } from './use-audible-cue';

function Harness({ alarms, play }: { alarms: AlarmView[] | undefined; play: () => void }) {
  useAudibleCue(alarms, play);
  return null;
}

const immediate = (id: string, raisedAtMs = 1000) =>
  makeAlarm(id, { priority: 'immediate', raisedAtMs });

describe('audible cue for new immediate alarms', () => {
  it('is off by default: a new immediate alarm makes no sound', () => {
    const play = vi.fn();
    const view = render(<Harness alarms={[]} play={play} />);
    view.rerender(<Harness alarms={[immediate('a')]} play={play} />);
    expect(play).not.toHaveBeenCalled();
    expect(localStorage.getItem(ALARM_SOUND_STORAGE_KEY)).toBeNull();
  });

  it('when on, sounds once per new immediate alarm, not for what was there at the start nor for lower priorities', () => {
    act(() => setAlarmSound(true));
    expect(localStorage.getItem(ALARM_SOUND_STORAGE_KEY)).toBe('on');
    const play = vi.fn();
    const view = render(<Harness alarms={[immediate('old')]} play={play} />);
    expect(play).not.toHaveBeenCalled();
    view.rerender(
      <Harness
        alarms={[immediate('old'), makeAlarm('watch', { priority: 'prompt' })]}
        play={play}
      />,
    );
    expect(play).not.toHaveBeenCalled();
    view.rerender(<Harness alarms={[immediate('old'), immediate('gate')]} play={play} />);
    expect(play).toHaveBeenCalledTimes(1);
    // fetched again: the same alarm does not sound again; raised anew later, it does
    view.rerender(<Harness alarms={[immediate('old'), immediate('gate')]} play={play} />);
    expect(play).toHaveBeenCalledTimes(1);
    view.rerender(<Harness alarms={[immediate('old'), immediate('gate', 5000)]} play={play} />);
    expect(play).toHaveBeenCalledTimes(2);
    // an acknowledged one is not new
    view.rerender(
      <Harness
        alarms={[
          immediate('old'),
          makeAlarm('x', { priority: 'immediate', acknowledged: true, state: 'acknowledged' }),
        ]}
        play={play}
      />,
    );
    expect(play).toHaveBeenCalledTimes(2);
  });

  it('makes its tones with Web Audio once switched on (the switch is the gesture the browser needs)', async () => {
    const started: number[] = [];
    class FakeAudioContext {
      state = 'running';
      currentTime = 0;
      destination = {};
      resume = vi.fn();
      createOscillator() {
        return {
          frequency: { value: 0 },
          connect: (g: unknown) => g,
          start: (t: number) => started.push(t),
          stop: vi.fn(),
        };
      }
      createGain() {
        return {
          gain: { setValueAtTime: vi.fn(), exponentialRampToValueAtTime: vi.fn() },
          connect: (d: unknown) => d,
        };
      }
    }
    vi.stubGlobal('AudioContext', FakeAudioContext);
    const { beep } = await import('./use-audible-cue');
    act(() => setAlarmSound(true));
    beep();
    expect(started.length).toBe(4);
  });
});
