import Typography from '@mui/material/Typography';
import { FORECAST_CAUTION } from '@stillwell/shared/forecasts';

/** The caution every forecast display carries, in the gateway's own words. */
export function ForecastCaution({ text = FORECAST_CAUTION }: { text?: string }) {
  return (
    <Typography
      variant="body2"
      data-testid="forecast-caution"
      sx={{ color: 'text.secondary', fontStyle: 'italic' }}
    >
      {text}
    </Typography>
  );
}
