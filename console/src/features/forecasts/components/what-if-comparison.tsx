import Box from '@mui/material/Box';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import type { CompareResponse } from '@stillwell/shared/forecasts';
import type { UnitSystem } from '@stillwell/shared/units';
import { Panel } from '../../../components/ui/panel';
import { fonts } from '../../../theme';
import { comparisonView, type ComparisonLine } from '../utils/comparison';
import { SIDE_STYLE } from '../utils/what-if-chart';

export interface WhatIfComparisonProps {
  result: CompareResponse;
  system: UnitSystem;
  timeZone: string;
}

function Value({ line, side }: { line: ComparisonLine; side: 'a' | 'b' }) {
  const worse = line.worse === side;
  return (
    <TableCell
      data-testid={`comparison-${line.id}-${side}`}
      data-worse={worse}
      sx={{
        fontFamily: fonts.mono,
        fontVariantNumeric: 'tabular-nums',
        color: worse ? 'signal.caution' : 'text.primary',
        fontWeight: worse ? 500 : 400,
      }}
    >
      {line[side]}
      {worse && (
        <Box component="span" sx={{ ml: 0.75, fontSize: '0.75rem', fontFamily: fonts.sans }}>
          (worse)
        </Box>
      )}
    </TableCell>
  );
}

function SideHeader({ label, side }: { label: string; side: 'a' | 'b' }) {
  const style = SIDE_STYLE[side];
  return (
    <TableCell data-testid={`comparison-label-${side}`}>
      <Box sx={{ display: 'flex', alignItems: 'center', gap: 1 }}>
        <Box
          aria-hidden
          component="span"
          sx={{
            width: 24,
            borderTop: `3px ${style.dash ? 'dashed' : 'solid'} ${style.stroke}`,
            flexShrink: 0,
          }}
        />
        <span>
          {side.toUpperCase()} · {label}
        </span>
      </Box>
    </TableCell>
  );
}

/** The two schedules side by side: the figures that decide between them, B minus A beside. */
export function WhatIfComparison({ result, system, timeZone }: WhatIfComparisonProps) {
  const view = comparisonView(result, system, timeZone);
  return (
    <Panel title="Side by side">
      <Box sx={{ overflowX: 'auto' }}>
        <Table size="small" aria-label="Comparison of the two schedules" data-testid="comparison">
          <TableHead>
            <TableRow>
              <TableCell />
              <SideHeader label={view.labelA} side="a" />
              <SideHeader label={view.labelB} side="b" />
              <TableCell>B − A</TableCell>
            </TableRow>
          </TableHead>
          <TableBody>
            {view.lines.map((line) => (
              <TableRow key={line.id} data-testid={`comparison-row-${line.id}`}>
                <TableCell component="th" scope="row" sx={{ color: 'text.secondary' }}>
                  {line.label}
                </TableCell>
                <Value line={line} side="a" />
                <Value line={line} side="b" />
                <TableCell sx={{ color: 'text.secondary', fontVariantNumeric: 'tabular-nums' }}>
                  {line.difference}
                </TableCell>
              </TableRow>
            ))}
          </TableBody>
        </Table>
      </Box>
      {view.warnings.map((w) => (
        <Typography key={w} role="alert" variant="body2" sx={{ color: 'signal.alarm', mt: 1 }}>
          {w}
        </Typography>
      ))}
    </Panel>
  );
}
