import ToggleButton from '@mui/material/ToggleButton';
import ToggleButtonGroup from '@mui/material/ToggleButtonGroup';
import type { UnitSystem } from '@stillwell/shared/units';

export interface UnitsToggleProps {
  value: UnitSystem;
  onChange: (system: UnitSystem) => void;
}

/** SI or US customary for display; the plant's values stay SI. */
export function UnitsToggle({ value, onChange }: UnitsToggleProps) {
  return (
    <ToggleButtonGroup
      size="small"
      exclusive
      value={value}
      aria-label="Display units"
      onChange={(_event, next: UnitSystem | null) => {
        if (next) onChange(next);
      }}
    >
      <ToggleButton value="si" aria-label="SI units">
        SI
      </ToggleButton>
      <ToggleButton value="us" aria-label="US customary units">
        US
      </ToggleButton>
    </ToggleButtonGroup>
  );
}
