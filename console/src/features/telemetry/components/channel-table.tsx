import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import { quantityOf, type UnitSystem } from '@stillwell/shared/units';
import { DoubtFlags } from '../../../components/ui/doubt-flags';
import { valueColor } from '../../../components/ui/tone';
import { formatAge, formatQuantity } from '../../../lib/format';
import type { ChannelView } from '../utils/channel-health';

export interface ChannelTableProps {
  channels: readonly ChannelView[];
  system: UnitSystem;
}

/** Every gauge's latest value and age; stale, suspect and bad are said in words. */
export function ChannelTable({ channels, system }: ChannelTableProps) {
  return (
    <Table size="small" aria-label="Gauges">
      <TableHead>
        <TableRow>
          <TableCell>Gauge</TableCell>
          <TableCell align="right">Value</TableCell>
          <TableCell>Unit</TableCell>
          <TableCell align="right">Age</TableCell>
          <TableCell>Condition</TableCell>
        </TableRow>
      </TableHead>
      <TableBody>
        {channels.map((channel) => {
          const shown =
            channel.value === null
              ? null
              : formatQuantity(channel.value, quantityOf(channel.unit), system);
          const unitText = formatQuantity(0, quantityOf(channel.unit), system).unitText;
          return (
            <TableRow
              key={channel.id}
              data-testid={`channel-row-${channel.id}`}
              data-stale={channel.stale ? 'true' : 'false'}
              data-quality={channel.quality ?? 'none'}
            >
              <TableCell component="th" scope="row">
                {channel.label}
              </TableCell>
              <TableCell align="right">
                <Typography
                  variant="numeric"
                  sx={{
                    color: valueColor('normal', channel.stale, channel.quality),
                    textDecoration: channel.quality === 'bad' ? 'line-through' : 'none',
                  }}
                >
                  {shown?.text ?? '—'}
                </Typography>
              </TableCell>
              <TableCell sx={{ color: 'text.secondary' }}>{unitText}</TableCell>
              <TableCell align="right">
                <Typography
                  variant="numeric"
                  sx={{ color: channel.stale ? 'signal.doubt' : 'text.secondary' }}
                >
                  {channel.ageS === null ? '—' : formatAge(channel.ageS)}
                </Typography>
              </TableCell>
              <TableCell>
                <DoubtFlags stale={channel.stale} quality={channel.quality} />
              </TableCell>
            </TableRow>
          );
        })}
      </TableBody>
    </Table>
  );
}
