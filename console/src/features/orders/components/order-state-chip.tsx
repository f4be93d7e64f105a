import Chip from '@mui/material/Chip';
import { ORDER_STATE_LABELS, type OrderState } from '@stillwell/shared/orders';

const TONE: Partial<Record<OrderState, 'warning' | 'error' | 'info' | 'success'>> = {
  proposed: 'warning',
  dispatched: 'info',
  travelling: 'info',
  holding: 'info',
  faulted: 'error',
};

export interface OrderStateChipProps {
  state: OrderState;
}

/** Greys for the quiet states; colour only where someone has to act or watch (ISA-101). */
export function OrderStateChip({ state }: OrderStateChipProps) {
  const tone = TONE[state];
  return (
    <Chip
      size="small"
      label={ORDER_STATE_LABELS[state]}
      color={tone ?? 'default'}
      variant={tone ? 'filled' : 'outlined'}
      data-testid="order-state"
      data-state={state}
    />
  );
}
