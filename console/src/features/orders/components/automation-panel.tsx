import { useState } from 'react';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Switch from '@mui/material/Switch';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import TextField from '@mui/material/TextField';
import Typography from '@mui/material/Typography';
import type { Me } from '@stillwell/shared/access';
import { controlsOf, type AutomaticRule } from '@stillwell/shared/orders';
import type { ReservoirDefinition } from '@stillwell/shared/reservoirs';
import { describeError } from '../../../lib/api-client';
import { formatSiteTime } from '../../../lib/format';
import { useAutomation, useUpdateRule } from '../api/get-automation';
import { ConfirmIdentityDialog } from './confirm-identity-dialog';
import { useSteppedUp } from './use-stepped-up';

export interface AutomationPanelProps {
  definition: ReservoirDefinition;
  me: Me | null;
}

const DEVICE_STATE: Record<AutomaticRule['device']['state'], string> = {
  'not-configured': 'never set',
  pending: 'sent, waiting for the controller',
  applied: 'in force at the controller',
  rejected: 'refused by the controller',
};

/** Automatic rules: a gate or valve opening by itself at a pool level; changed by engineers only. */
export function AutomationPanel({ definition, me }: AutomationPanelProps) {
  const view = useAutomation(definition.id);
  const update = useUpdateRule(definition.id);
  const stepped = useSteppedUp();
  const [editing, setEditing] = useState<{
    control: string;
    enabled: boolean;
    riseAbove: string;
    target: string;
  } | null>(null);
  const controls = controlsOf(definition);
  const may =
    (me?.permissions as readonly string[] | undefined)?.includes('automation.edit') ?? false;
  const at = (iso: string | null) =>
    iso ? formatSiteTime(Date.parse(iso), definition.timeZone).time : '—';
  const save = () => {
    if (!editing) return;
    const body = {
      enabled: editing.enabled,
      riseAbove: Number(editing.riseAbove),
      target: Number(editing.target),
    };
    stepped.run(`Changing the automatic rule of ${editing.control}`, (onError) =>
      update.mutate(
        { control: editing.control, body },
        { onSuccess: () => setEditing(null), onError: (e) => void onError(e) },
      ),
    );
  };
  return (
    <Box sx={{ display: 'grid', gap: 1 }} data-testid="automation-panel">
      <Table size="small">
        <TableHead>
          <TableRow>
            <TableCell>Gate or valve</TableCell>
            <TableCell>Rule</TableCell>
            <TableCell>At the controller</TableCell>
            <TableCell>Last opened by itself</TableCell>
            <TableCell />
          </TableRow>
        </TableHead>
        <TableBody>
          {(view.data?.rules ?? []).map((r) => {
            const c = controls.find((x) => x.id === r.control);
            return (
              <TableRow key={r.control} data-testid="automation-rule" data-control={r.control}>
                <TableCell>{c?.label ?? r.control}</TableCell>
                <TableCell>
                  {r.device.state === 'not-configured'
                    ? 'none'
                    : `${r.enabled ? 'on' : 'off'}: open to ${r.target} ${c?.unit ?? ''} when the pool reaches ${r.riseAbove.toFixed(2)} m`}
                </TableCell>
                <TableCell>
                  {DEVICE_STATE[r.device.state]}
                  {r.device.detail ? `: ${r.device.detail}` : ''}
                </TableCell>
                <TableCell>{at(r.lastTriggeredAt)}</TableCell>
                <TableCell>
                  {may && (
                    <Button
                      size="small"
                      onClick={() =>
                        setEditing({
                          control: r.control,
                          enabled: r.enabled,
                          riseAbove: String(r.riseAbove),
                          target: String(r.target),
                        })
                      }
                    >
                      Change
                    </Button>
                  )}
                </TableCell>
              </TableRow>
            );
          })}
        </TableBody>
      </Table>
      {editing && (
        <Box sx={{ display: 'flex', gap: 1, alignItems: 'center', flexWrap: 'wrap' }}>
          <Typography variant="body2">{editing.control}:</Typography>
          <Switch
            checked={editing.enabled}
            onChange={(e) => setEditing({ ...editing, enabled: e.target.checked })}
            slotProps={{ input: { 'aria-label': 'rule on' } }}
          />
          <TextField
            size="small"
            type="number"
            label="Pool reaches (m)"
            value={editing.riseAbove}
            onChange={(e) => setEditing({ ...editing, riseAbove: e.target.value })}
          />
          <TextField
            size="small"
            type="number"
            label="Open to"
            value={editing.target}
            onChange={(e) => setEditing({ ...editing, target: e.target.value })}
          />
          <Button variant="contained" onClick={save} disabled={update.isPending}>
            Save and send
          </Button>
          <Button onClick={() => setEditing(null)}>Cancel</Button>
        </Box>
      )}
      {update.isError && <Alert severity="error">{describeError(update.error)}</Alert>}
      {(view.data?.events.length ?? 0) > 0 && (
        <Box>
          <Typography variant="body2" color="text.secondary">
            Reported by the controller:
          </Typography>
          {view.data!.events.slice(0, 8).map((e) => (
            <Typography key={e.eventId} variant="body2" data-testid="automation-event">
              {at(e.time)} {e.kind}
              {e.control ? ` ${e.control}` : ''}
              {e.kind === 'triggered'
                ? ` opened to ${e.target} at pool ${e.pool?.toFixed(2)} m`
                : ''}
              {e.detail ? `: ${e.detail}` : ''}
            </Typography>
          ))}
        </Box>
      )}
      <ConfirmIdentityDialog {...stepped.dialog} totpEnabled={me?.totpEnabled ?? false} />
    </Box>
  );
}
