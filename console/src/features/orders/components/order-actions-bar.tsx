import { useState } from 'react';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import TextField from '@mui/material/TextField';
import Typography from '@mui/material/Typography';
import type { Me } from '@stillwell/shared/access';
import {
  countersignRefusal,
  executeRefusal,
  reviewRefusal,
  withdrawRefusal,
  type Emergency,
  type Order,
} from '@stillwell/shared/orders';
import { ApiError, describeError } from '../../../lib/api-client';
import { useOrderAction, type OrderAction } from '../api/order-actions';
import { ConfirmIdentityDialog } from './confirm-identity-dialog';
import { useSteppedUp } from './use-stepped-up';

export interface OrderActionsBarProps {
  order: Order;
  me: Me;
  emergency: Emergency | null;
  siteNowMs: number;
}

/**
 * What the signed-in person may do with the order, each button explained when it is not
 * offered. The explanations come from the shared rules; the gateway decides whatever is clicked.
 */
export function OrderActionsBar({ order, me, emergency, siteNowMs }: OrderActionsBarProps) {
  const [comment, setComment] = useState('');
  const action = useOrderAction();
  const stepped = useSteppedUp();
  const may = (a: string) => (me.permissions as readonly string[]).includes(a);
  const actor = { userId: me.id };

  const act = (what: OrderAction, purpose: string) =>
    stepped.run(purpose, (onError) =>
      action.mutate(
        { orderId: order.id, action: what, comment: comment.trim() || undefined },
        { onError: (e) => void onError(e), onSuccess: () => setComment('') },
      ),
    );

  const review = may('orders.authorise') ? reviewRefusal(order, actor) : null;
  const execute = may('orders.execute') ? executeRefusal(order, emergency, siteNowMs) : null;
  const withdraw = may('orders.draft') ? withdrawRefusal(order) : null;
  const countersign = may('orders.countersign') ? countersignRefusal(order, actor) : null;
  const underEmergency = order.state === 'proposed' && emergency !== null && !execute;
  const needsComment = may('orders.authorise') || may('orders.countersign') || may('orders.draft');
  const stepUpError = action.error instanceof ApiError && action.error.code === 'step-up-required';
  const interlocks =
    action.error instanceof ApiError && action.error.code === 'interlock'
      ? ((
          action.error.body as {
            interlocks?: {
              results: Array<{ code: string; ok: boolean; waived: boolean; message: string }>;
            };
          }
        )?.interlocks?.results ?? [])
      : [];

  const buttons: Array<{
    show: boolean;
    label: string;
    testId: string;
    onClick: () => void;
    disabled?: boolean;
    colour?: 'error' | 'warning' | 'primary';
  }> = [
    {
      show: may('orders.authorise') && !review,
      label: 'Authorise',
      testId: 'order-authorise',
      onClick: () => act('authorise', `Authorising order ${order.id}`),
      disabled: comment.trim().length < 3,
    },
    {
      show: may('orders.authorise') && !review,
      label: 'Decline',
      testId: 'order-decline',
      onClick: () => act('decline', `Declining order ${order.id}`),
      disabled: comment.trim().length < 3,
    },
    {
      show: may('orders.execute') && !execute,
      label: underEmergency ? 'Send to gates under the emergency' : 'Send to gates',
      testId: 'order-execute',
      onClick: () => act('execute', `Executing order ${order.id}`),
      colour: underEmergency ? 'error' : 'primary',
    },
    {
      show: may('orders.draft') && !withdraw,
      label: 'Withdraw',
      testId: 'order-withdraw',
      onClick: () => act('withdraw', `Withdrawing order ${order.id}`),
      disabled: comment.trim().length < 3,
    },
    {
      show: may('orders.countersign') && !countersign,
      label: 'Countersign',
      testId: 'order-countersign',
      onClick: () => act('countersign', `Countersigning order ${order.id}`),
      disabled: comment.trim().length < 3,
    },
  ];
  const reasons = [review, execute, countersign]
    .filter(
      (r): r is NonNullable<typeof r> =>
        r !== null && r.code !== 'wrong-state' && r.code !== 'countersign-not-needed',
    )
    .map((r) => r.message);
  const shown = buttons.filter((b) => b.show);

  return (
    <Box sx={{ display: 'grid', gap: 1 }} data-testid="order-actions">
      {shown.length > 0 && needsComment && shown.some((b) => b.testId !== 'order-execute') && (
        <TextField
          label="Comment (what you checked, why)"
          multiline
          minRows={2}
          value={comment}
          onChange={(e) => setComment(e.target.value)}
          slotProps={{ htmlInput: { 'data-testid': 'order-comment' } }}
        />
      )}
      <Box sx={{ display: 'flex', gap: 1, flexWrap: 'wrap' }}>
        {shown.map((b) => (
          <Button
            key={b.testId}
            variant={
              b.testId === 'order-execute' || b.testId === 'order-authorise'
                ? 'contained'
                : 'outlined'
            }
            color={b.colour ?? 'primary'}
            onClick={b.onClick}
            disabled={b.disabled || action.isPending}
            data-testid={b.testId}
          >
            {b.label}
          </Button>
        ))}
      </Box>
      {reasons.map((r) => (
        <Typography key={r} variant="body2" color="text.secondary" data-testid="order-not-offered">
          {r}
        </Typography>
      ))}
      {action.isError && !stepUpError && (
        <Alert severity="error" data-testid="order-action-error">
          {interlocks.length > 0
            ? 'Not sent: the interlocks refused.'
            : describeError(action.error)}
          {interlocks.length > 0 && (
            <Box component="ul" sx={{ m: 0, pl: 2 }}>
              {interlocks
                .filter((i) => !i.ok && !i.waived)
                .map((i) => (
                  <li key={i.code}>{i.message}</li>
                ))}
            </Box>
          )}
        </Alert>
      )}
      <ConfirmIdentityDialog {...stepped.dialog} totpEnabled={me.totpEnabled} />
    </Box>
  );
}
