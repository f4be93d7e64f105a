/**
 * Design tokens of the control-room theme. Normal states are drawn in greys; colour is kept for
 * what needs attention (ISA-101), so an operator's eye goes to the few coloured things on screen.
 */
export const surface = {
  app: '#16181a',
  panel: '#1e2124',
  raised: '#262a2e',
  line: '#353b41',
} as const;

export const ink = {
  primary: '#d5d9dd',
  secondary: '#9ea6ae',
  muted: '#737c85',
} as const;

/** Normal data: water, series and reference lines. */
export const dataInk = {
  level: '#e4e9ee',
  flow: '#7d9fc0',
  water: '#46525e',
  waterSurface: '#b5bfc9',
  reference: '#6f7881',
  crest: '#a7b0b9',
  /** forecast band: its p10/p90 edges and the shade between them (the spread, not a colour alarm) */
  band: '#7f8c99',
  bandFill: 'rgba(157, 179, 199, 0.2)',
} as const;

/** Kept for abnormal states only. */
export const signal = {
  /** a threshold of the alert kind is exceeded */
  caution: '#e4a72f',
  /** a spillway, freeboard or crest threshold is exceeded; the freeboard is short */
  alarm: '#f05c47',
  /** the data itself is in doubt: stale, suspect or bad */
  doubt: '#b996e8',
  /** text on a filled signal colour */
  onSignal: '#121314',
} as const;

export const accent = '#9db3c7';

export const fonts = {
  sans: '"Roboto", system-ui, "Segoe UI", Arial, sans-serif',
  mono: '"Roboto Mono", ui-monospace, "SFMono-Regular", Menlo, Consolas, monospace',
} as const;
