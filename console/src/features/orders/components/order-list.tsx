import Chip from '@mui/material/Chip';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import { controlsOf, type Order } from '@stillwell/shared/orders';
import type { ReservoirDefinition } from '@stillwell/shared/reservoirs';
import { formatSiteTime } from '../../../lib/format';
import { describeTargets } from '../utils/draft';
import { OrderStateChip } from './order-state-chip';

export interface OrderListProps {
  orders: readonly Order[];
  definition: ReservoirDefinition;
  selected: number | null;
  onSelect: (id: number) => void;
  /** shown when there are none */
  empty: string;
  testId: string;
}

export function OrderList({
  orders,
  definition,
  selected,
  onSelect,
  empty,
  testId,
}: OrderListProps) {
  const controls = controlsOf(definition);
  if (!orders.length)
    return (
      <Typography variant="body2" color="text.secondary" data-testid={`${testId}-empty`}>
        {empty}
      </Typography>
    );
  return (
    <Table size="small" data-testid={testId}>
      <TableHead>
        <TableRow>
          <TableCell>Order</TableCell>
          <TableCell>State</TableCell>
          <TableCell>Moves</TableCell>
          <TableCell>Drafted</TableCell>
        </TableRow>
      </TableHead>
      <TableBody>
        {orders.map((o) => (
          <TableRow
            key={o.id}
            hover
            selected={o.id === selected}
            onClick={() => onSelect(o.id)}
            sx={{ cursor: 'pointer' }}
            data-testid="order-row"
            data-order-id={o.id}
            data-state={o.state}
          >
            <TableCell>
              {o.id}
              {o.emergency && <Chip size="small" color="error" label="EMERGENCY" sx={{ ml: 1 }} />}
            </TableCell>
            <TableCell>
              <OrderStateChip state={o.state} />
            </TableCell>
            <TableCell>
              {describeTargets(o.steps[0]?.targets ?? [], controls)}
              {o.steps.length > 1 ? ` (+${o.steps.length - 1} steps)` : ''}
            </TableCell>
            <TableCell>
              {o.author.username},{' '}
              {formatSiteTime(Date.parse(o.createdAt), definition.timeZone).time}
            </TableCell>
          </TableRow>
        ))}
      </TableBody>
    </Table>
  );
}
