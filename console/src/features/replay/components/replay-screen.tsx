import { useCallback, useMemo, useState } from 'react';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Typography from '@mui/material/Typography';
import { alarmsAt } from '@stillwell/shared/replay';
import type { ReservoirDefinition } from '@stillwell/shared/reservoirs';
import { displayUnit, quantityOf, toDisplay } from '@stillwell/shared/units';
import { Panel } from '../../../components/ui/panel';
import { ErrorMessage, LoadingMessage } from '../../../components/ui/state-message';
import { useUnitSystem } from '../../../hooks/use-unit-system';
import { describeError } from '../../../lib/api-client';
import { unitLabel } from '../../../lib/format';
import { useReplayEntries } from '../api/get-replay-entries';
import { useReplayEvents } from '../api/get-replay-events';
import { useReplayForecast } from '../api/get-replay-forecast';
import { useReplayWindow } from '../api/get-replay-window';
import { usePlayback } from '../hooks/use-playback';
import { buildChartData } from '../utils/chart-data';
import { timeline } from '../utils/entry-text';
import { lastAtOrBefore } from '../utils/playback';
import { resolutionLabel } from '../utils/resolution-label';
import { MomentPanel } from './moment-panel';
import { ReplayChart } from './replay-chart';
import { TimelineList } from './timeline-list';
import { TransportControls } from './transport-controls';
import { WindowPicker, type ReplayRange } from './window-picker';

export interface ReplayScreenProps {
  definition: ReservoirDefinition;
}

/** The replay: a window of the record played back with everything in step. */
export function ReplayScreen({ definition }: ReplayScreenProps) {
  const reservoirId = definition.id;
  const timeZone = definition.timeZone;
  const [system] = useUnitSystem();
  const events = useReplayEvents(reservoirId);
  const [choice, setChoice] = useState<{ range: ReplayRange; eventId: string | null } | null>(null);
  // until someone chooses, the newest event found
  const first = events.data?.events[0];
  const current = choice ?? (first ? { range: first, eventId: first.id } : null);
  const range = current ? { fromMs: current.range.fromMs, toMs: current.range.toMs } : null;
  const window = useReplayWindow(reservoirId, range);
  const entries = useReplayEntries(reservoirId, range);
  const playback = usePlayback(range?.fromMs ?? 0, range?.toMs ?? 0);

  const runs = window.data?.forecastRuns ?? [];
  const runIndex = lastAtOrBefore(runs, playback.cursorMs, (r) => r.computedAtMs);
  const forecast = useReplayForecast(reservoirId, runIndex >= 0 ? runs[runIndex]!.id : null);
  const shownForecast = runIndex >= 0 ? (forecast.data ?? null) : null;

  const convert = useCallback(
    (v: number, unit: Parameters<typeof quantityOf>[0]) =>
      toDisplay(v, quantityOf(unit), system).value,
    [system],
  );
  const chart = useMemo(
    () => buildChartData(window.data?.series ?? [], shownForecast, convert),
    [window.data, shownForecast, convert],
  );
  const items = useMemo(
    () => timeline(entries.data?.entries ?? [], window.data?.alarmEvents ?? []),
    [entries.data, window.data],
  );
  const currentIndex = lastAtOrBefore(items, playback.cursorMs, (i) => i.siteTimeMs);
  const alarms = useMemo(
    () =>
      window.data
        ? alarmsAt(window.data.alarmsAtStart, window.data.alarmEvents, playback.cursorMs)
        : [],
    [window.data, playback.cursorMs],
  );

  return (
    <Box sx={{ display: 'grid', gap: 2 }} data-testid="replay-screen">
      <title>{`Replay · ${definition.name} · Stillwell`}</title>
      <Panel title="Window">
        {events.isPending && <LoadingMessage label="Looking for events in the record…" />}
        {events.isError && (
          <ErrorMessage
            title="The events could not be loaded."
            detail={describeError(events.error)}
          />
        )}
        {events.data && (
          <WindowPicker
            key={current?.eventId ?? 'custom'}
            events={events.data.events}
            value={current?.range ?? null}
            selectedEventId={current?.eventId ?? null}
            timeZone={timeZone}
            onChange={(r, eventId) => setChoice({ range: r, eventId })}
          />
        )}
      </Panel>
      {range && (
        <Panel
          title="Playback"
          aside={
            window.data && (
              <Typography variant="caption" color="text.secondary" data-testid="replay-resolution">
                {resolutionLabel(window.data.resolution)}: {window.data.resolutionReason}
              </Typography>
            )
          }
        >
          <TransportControls
            fromMs={range.fromMs}
            toMs={range.toMs}
            cursorMs={playback.cursorMs}
            playing={playback.playing}
            speed={playback.speed}
            timeZone={timeZone}
            onPlaying={playback.setPlaying}
            onStep={playback.step}
            onSpeed={playback.setSpeed}
            onSeek={playback.seek}
          />
          {window.isPending && <LoadingMessage label="Loading the record of the window…" />}
          {window.isError && (
            <ErrorMessage
              title="The window could not be loaded."
              detail={describeError(window.error)}
            />
          )}
          {window.data && (
            <ReplayChart
              specs={chart.specs}
              data={chart.data}
              fromMs={range.fromMs}
              toMs={range.toMs}
              cursorMs={playback.cursorMs}
              timeZone={timeZone}
              units={{
                level: unitLabel(displayUnit('length', system)),
                flow: unitLabel(displayUnit('flow', system)),
                opening: unitLabel(displayUnit('length', system)),
              }}
              onSeek={playback.seek}
            />
          )}
        </Panel>
      )}
      {range && window.data && (
        <Box sx={{ display: 'grid', gap: 2, gridTemplateColumns: { xs: '1fr', lg: '2fr 1fr' } }}>
          <Panel title="Record as it happened">
            {entries.isError && (
              <ErrorMessage
                title="The logbook could not be loaded."
                detail={describeError(entries.error)}
              />
            )}
            {entries.data && entries.data.total > entries.data.entries.length && (
              <Alert severity="warning" sx={{ mb: 1 }}>
                Showing the first {entries.data.entries.length} of {entries.data.total} entries:
                choose a shorter window to see them all.
              </Alert>
            )}
            <TimelineList
              items={items}
              currentIndex={currentIndex}
              timeZone={timeZone}
              onSelect={playback.seek}
            />
          </Panel>
          <Panel title="At that moment">
            <MomentPanel
              cursorMs={playback.cursorMs}
              series={window.data.series}
              alarms={alarms}
              forecast={shownForecast}
              system={system}
              timeZone={timeZone}
            />
          </Panel>
        </Box>
      )}
    </Box>
  );
}
