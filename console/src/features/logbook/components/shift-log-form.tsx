import { useState } from 'react';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import MenuItem from '@mui/material/MenuItem';
import TextField from '@mui/material/TextField';
import ToggleButton from '@mui/material/ToggleButton';
import ToggleButtonGroup from '@mui/material/ToggleButtonGroup';
import { ATTACHMENT_LIMITS } from '@stillwell/shared/logbook';
import { controlsOf } from '@stillwell/shared/orders';
import type { ReservoirDefinition } from '@stillwell/shared/reservoirs';
import { describeError } from '../../../lib/api-client';
import { usePostShiftLog } from '../api/shift-log';

export interface ShiftLogFormProps {
  definition: ReservoirDefinition;
}

/** The operator's own entries: a note, or a handover to the next shift, with photos or PDFs. */
export function ShiftLogForm({ definition }: ShiftLogFormProps) {
  const [kind, setKind] = useState<'note' | 'handover'>('note');
  const [text, setText] = useState('');
  const [to, setTo] = useState('');
  const [controls, setControls] = useState<string[]>([]);
  const [files, setFiles] = useState<File[]>([]);
  const [inputKey, setInputKey] = useState(0);
  const post = usePostShiftLog();
  const tooBig = files.find((f) => f.size > ATTACHMENT_LIMITS.maxBytes);
  const submit = () =>
    post.mutate(
      { kind, text, to, controls, files },
      {
        onSuccess: () => {
          setText('');
          setTo('');
          setFiles([]);
          setInputKey((k) => k + 1);
        },
      },
    );
  return (
    <Box sx={{ display: 'grid', gap: 1 }} data-testid="shift-log-form">
      <ToggleButtonGroup
        exclusive
        size="small"
        value={kind}
        onChange={(_e, v: 'note' | 'handover' | null) => v && setKind(v)}
      >
        <ToggleButton value="note">Shift note</ToggleButton>
        <ToggleButton value="handover">Handover</ToggleButton>
      </ToggleButtonGroup>
      {kind === 'handover' && (
        <TextField
          size="small"
          label="Handing over to"
          value={to}
          onChange={(e) => setTo(e.target.value)}
        />
      )}
      <TextField
        label={kind === 'note' ? 'Note' : 'What the next shift must know'}
        multiline
        minRows={3}
        value={text}
        onChange={(e) => setText(e.target.value)}
        slotProps={{ htmlInput: { 'data-testid': 'shift-log-text' } }}
      />
      <TextField
        select
        size="small"
        label="About gates"
        value={controls}
        onChange={(e) =>
          setControls(
            typeof e.target.value === 'string'
              ? e.target.value.split(',')
              : (e.target.value as string[]),
          )
        }
        slotProps={{ select: { multiple: true } }}
      >
        {controlsOf(definition).map((c) => (
          <MenuItem key={c.id} value={c.id}>
            {c.label}
          </MenuItem>
        ))}
      </TextField>
      <Button component="label" size="small" variant="outlined">
        Attach photos or PDF notes ({files.length || 'none'})
        <input
          key={inputKey}
          hidden
          type="file"
          multiple
          accept="image/jpeg,image/png,application/pdf"
          onChange={(e) =>
            setFiles([...(e.target.files ?? [])].slice(0, ATTACHMENT_LIMITS.maxFiles))
          }
        />
      </Button>
      {tooBig && (
        <Alert severity="warning">
          {tooBig.name} is over {ATTACHMENT_LIMITS.maxBytes / 1024 / 1024} MB.
        </Alert>
      )}
      {post.isError && <Alert severity="error">{describeError(post.error)}</Alert>}
      <Box>
        <Button
          variant="contained"
          onClick={submit}
          disabled={
            !text.trim() ||
            (kind === 'handover' && to.trim().length < 2) ||
            Boolean(tooBig) ||
            post.isPending
          }
          data-testid="shift-log-submit"
        >
          {kind === 'note' ? 'Add to the shift log' : 'Record the handover'}
        </Button>
      </Box>
    </Box>
  );
}
