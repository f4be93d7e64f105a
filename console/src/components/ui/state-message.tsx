import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import CircularProgress from '@mui/material/CircularProgress';
import Typography from '@mui/material/Typography';

export interface LoadingMessageProps {
  label: string;
}

export function LoadingMessage({ label }: LoadingMessageProps) {
  return (
    <Box role="status" sx={{ display: 'flex', alignItems: 'center', gap: 1.5, p: 3 }}>
      <CircularProgress size={20} color="inherit" aria-hidden />
      <Typography sx={{ color: 'text.secondary' }}>{label}</Typography>
    </Box>
  );
}

export interface ErrorMessageProps {
  title: string;
  detail: string;
}

export function ErrorMessage({ title, detail }: ErrorMessageProps) {
  return (
    <Alert severity="error" variant="outlined" sx={{ m: 2 }}>
      <strong>{title}</strong> {detail}
    </Alert>
  );
}
