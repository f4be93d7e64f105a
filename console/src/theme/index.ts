import type { CSSProperties } from 'react';
import { createTheme } from '@mui/material/styles';
import { accent, dataInk, fonts, ink, signal, surface } from './tokens';

export type SignalPalette = typeof signal;
export type DataPalette = typeof dataInk;

declare module '@mui/material/styles' {
  interface Palette {
    signal: SignalPalette;
    data: DataPalette;
  }
  interface PaletteOptions {
    signal?: SignalPalette;
    data?: DataPalette;
  }
  interface TypographyVariants {
    /** a large live number */
    readout: CSSProperties;
    /** numbers inside running text and tables */
    numeric: CSSProperties;
  }
  interface TypographyVariantsOptions {
    readout?: CSSProperties;
    numeric?: CSSProperties;
  }
}

declare module '@mui/material/Typography' {
  interface TypographyPropsVariantOverrides {
    readout: true;
    numeric: true;
  }
}

const tabular: CSSProperties = { fontFamily: fonts.mono, fontVariantNumeric: 'tabular-nums' };

/** The console's one theme: tokens above, component overrides below, merged here only. */
export const theme = createTheme({
  palette: {
    mode: 'dark',
    primary: { main: accent, contrastText: signal.onSignal },
    error: { main: signal.alarm },
    warning: { main: signal.caution },
    background: { default: surface.app, paper: surface.panel },
    text: { primary: ink.primary, secondary: ink.secondary, disabled: ink.muted },
    divider: surface.line,
    signal,
    data: dataInk,
  },
  typography: {
    fontFamily: fonts.sans,
    // Read from a step back across a console desk.
    fontSize: 15,
    h1: { fontSize: '1.6rem', fontWeight: 500 },
    h2: { fontSize: '1.25rem', fontWeight: 500 },
    h3: { fontSize: '1.05rem', fontWeight: 500, letterSpacing: '0.02em' },
    overline: { fontSize: '0.78rem', fontWeight: 500, letterSpacing: '0.08em', lineHeight: 1.6 },
    readout: { ...tabular, fontSize: '2rem', fontWeight: 500, lineHeight: 1.15 },
    numeric: { ...tabular, fontSize: 'inherit' },
  },
  shape: { borderRadius: 4 },
  components: {
    MuiCssBaseline: {
      styleOverrides: {
        body: { backgroundColor: surface.app },
        // uPlot draws on canvas; only its legend and cursor are HTML.
        '.u-legend': { color: ink.secondary, fontFamily: fonts.mono, fontSize: '0.85rem' },
        '.u-legend .u-marker': { borderRadius: 2 },
        '.u-select': { background: 'rgba(157, 179, 199, 0.12)' },
      },
    },
    MuiTypography: {
      defaultProps: {
        variantMapping: { readout: 'span', numeric: 'span' },
      },
    },
    MuiPaper: {
      defaultProps: { elevation: 0 },
      styleOverrides: {
        // No glossy overlays on dark surfaces: a flat panel with a hairline edge.
        root: { backgroundImage: 'none', border: `1px solid ${surface.line}` },
      },
    },
    MuiAppBar: {
      defaultProps: { elevation: 0, color: 'default' },
      styleOverrides: {
        root: {
          backgroundColor: surface.panel,
          borderWidth: '0 0 1px 0',
          borderStyle: 'solid',
          borderColor: surface.line,
        },
      },
    },
    MuiTableCell: {
      styleOverrides: {
        root: { borderColor: surface.line, paddingTop: 6, paddingBottom: 6 },
        head: {
          color: ink.secondary,
          fontSize: '0.78rem',
          fontWeight: 500,
          letterSpacing: '0.06em',
          textTransform: 'uppercase',
        },
      },
    },
    MuiChip: {
      styleOverrides: {
        root: { fontWeight: 500, letterSpacing: '0.04em' },
        sizeSmall: { height: 22, fontSize: '0.72rem' },
      },
    },
    MuiToggleButton: {
      styleOverrides: {
        root: {
          color: ink.secondary,
          paddingTop: 4,
          paddingBottom: 4,
          '&.Mui-selected': { color: ink.primary, backgroundColor: surface.raised },
        },
      },
    },
    MuiTooltip: {
      styleOverrides: {
        tooltip: {
          backgroundColor: surface.raised,
          color: ink.primary,
          border: `1px solid ${surface.line}`,
          fontSize: '0.85rem',
        },
      },
    },
  },
});

export { accent, dataInk, fonts, ink, signal, surface } from './tokens';
