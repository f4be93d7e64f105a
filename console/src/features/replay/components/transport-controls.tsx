import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import MenuItem from '@mui/material/MenuItem';
import Slider from '@mui/material/Slider';
import TextField from '@mui/material/TextField';
import Typography from '@mui/material/Typography';
import { formatSiteTime } from '../../../lib/format';
import { SPEEDS, type Speed } from '../utils/playback';

export interface TransportControlsProps {
  fromMs: number;
  toMs: number;
  cursorMs: number;
  playing: boolean;
  speed: Speed;
  timeZone: string;
  onPlaying: (playing: boolean) => void;
  onStep: (direction: 1 | -1) => void;
  onSpeed: (speed: Speed) => void;
  onSeek: (ms: number) => void;
}

const speedLabel = (s: Speed) => (s === 1 ? 'real time (1x)' : `${s}x`);

/** Play, pause, step, speed and the scrub slider, with the replay's moment in site time. */
export function TransportControls(p: TransportControlsProps) {
  const shown = formatSiteTime(p.cursorMs, p.timeZone);
  return (
    <Box sx={{ display: 'flex', flexWrap: 'wrap', alignItems: 'center', gap: 1.5 }}>
      <Button variant="outlined" onClick={() => p.onStep(-1)} aria-label="Step back 5 minutes">
        − 5 min
      </Button>
      <Button
        variant="contained"
        onClick={() => p.onPlaying(!p.playing)}
        data-testid="replay-play"
        sx={{ minWidth: 96 }}
      >
        {p.playing ? 'Pause' : 'Play'}
      </Button>
      <Button variant="outlined" onClick={() => p.onStep(1)} aria-label="Step forward 5 minutes">
        + 5 min
      </Button>
      <TextField
        select
        size="small"
        label="Speed"
        value={p.speed}
        onChange={(e) => p.onSpeed(Number(e.target.value) as Speed)}
        slotProps={{ htmlInput: { 'data-testid': 'replay-speed' } }}
        sx={{ width: 150 }}
      >
        {SPEEDS.map((s) => (
          <MenuItem key={s} value={s}>
            {speedLabel(s)}
          </MenuItem>
        ))}
      </TextField>
      <Typography
        data-testid="replay-cursor-time"
        data-cursor-ms={Math.round(p.cursorMs)}
        sx={{ fontFamily: 'monospace', fontSize: 18, minWidth: 230 }}
      >
        {shown.date} {shown.time} {shown.zone}
      </Typography>
      <Slider
        aria-label="Replay time"
        data-testid="replay-scrub"
        min={p.fromMs}
        max={p.toMs}
        step={1000}
        value={Math.min(p.toMs, Math.max(p.fromMs, p.cursorMs))}
        onChange={(_e, v) => p.onSeek(v as number)}
        valueLabelDisplay="off"
        sx={{ flex: '1 1 320px', mx: 1 }}
      />
    </Box>
  );
}
