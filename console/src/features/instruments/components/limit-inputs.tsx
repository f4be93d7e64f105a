import { memo } from 'react';
import Box from '@mui/material/Box';
import InputAdornment from '@mui/material/InputAdornment';
import TextField from '@mui/material/TextField';
import Typography from '@mui/material/Typography';
import type { LimitField, LimitValues } from '../utils/limit-fields';

export interface LimitInputsProps {
  fields: readonly LimitField[];
  values: LimitValues;
  /** messages by field key */
  errors: Record<string, string>;
  readOnly: boolean;
  onChange: (key: string, value: string) => void;
}

/** The limits, grouped by what they belong to (the pool, each weir, each piezometer). */
export function LimitInputs({ fields, values, errors, readOnly, onChange }: LimitInputsProps) {
  const groups = [...new Set(fields.map((f) => f.group))];
  return (
    <Box sx={{ display: 'grid', gap: 2 }}>
      {groups.map((group) => (
        <Box component="fieldset" key={group} sx={{ border: 0, p: 0, m: 0, minWidth: 0 }}>
          <Typography component="legend" variant="subtitle2" sx={{ mb: 1 }}>
            {group}
          </Typography>
          <Box
            sx={{
              display: 'grid',
              gap: 1.5,
              gridTemplateColumns: 'repeat(auto-fill, minmax(180px, 1fr))',
            }}
          >
            {fields
              .filter((f) => f.group === group)
              .map((f) => (
                <LimitInput
                  key={f.key}
                  field={f}
                  value={values[f.key] ?? ''}
                  error={errors[f.key]}
                  readOnly={readOnly}
                  onChange={onChange}
                />
              ))}
          </Box>
        </Box>
      ))}
    </Box>
  );
}

interface LimitInputProps {
  field: LimitField;
  value: string;
  error: string | undefined;
  readOnly: boolean;
  onChange: (key: string, value: string) => void;
}

/** One limit; memoised, so typing in one field does not redraw the fifty others. */
const LimitInput = memo(function LimitInput({
  field: f,
  value,
  error,
  readOnly,
  onChange,
}: LimitInputProps) {
  return (
    <TextField
      size="small"
      // read-only limits read as values, not as fields waiting for input
      variant={readOnly ? 'standard' : 'outlined'}
      label={f.label}
      value={value}
      onChange={(e) => onChange(f.key, e.target.value)}
      error={Boolean(error)}
      helperText={error}
      slotProps={{
        input: {
          readOnly,
          ...(readOnly ? { disableUnderline: true } : {}),
          endAdornment: f.unit ? (
            <InputAdornment position="end">{f.unit}</InputAdornment>
          ) : undefined,
        },
        htmlInput: { inputMode: 'decimal', 'data-testid': `limit-${f.key}` },
      }}
    />
  );
});
