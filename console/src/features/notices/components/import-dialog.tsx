import { useState } from 'react';
import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogTitle from '@mui/material/DialogTitle';
import TextField from '@mui/material/TextField';
import Typography from '@mui/material/Typography';
import { CONTACT_CSV_COLUMNS } from '@stillwell/shared/notices';
import { describeError } from '../../../lib/api-client';
import { useImportContacts } from '../api/import-contacts';

export interface ImportDialogProps {
  reservoirId: string;
  onClose: () => void;
}

/** A contacts file, all or nothing; every problem listed with its row and column to fix in one go. */
export function ImportDialog({ reservoirId, onClose }: ImportDialogProps) {
  const [csv, setCsv] = useState('');
  const importer = useImportContacts(reservoirId);
  const result = importer.data;
  const readFile = async (file: File | undefined) => {
    if (file) setCsv(await file.text());
  };
  return (
    <Dialog open onClose={onClose} maxWidth="md" fullWidth>
      <DialogTitle>Import contacts from CSV</DialogTitle>
      <DialogContent sx={{ display: 'grid', gap: 2 }}>
        <Typography variant="body2" sx={{ color: 'text.secondary' }}>
          Columns: {CONTACT_CSV_COLUMNS.join(', ')} (username, active and ack_window_min may be left
          out). Times in minutes. Nothing is imported while any row has a problem.
        </Typography>
        <Button component="label" variant="outlined">
          Choose a file
          <input
            hidden
            type="file"
            accept=".csv,text/csv"
            aria-label="Contacts file"
            onChange={(e) => void readFile(e.target.files?.[0])}
          />
        </Button>
        <TextField
          label="CSV"
          multiline
          minRows={6}
          value={csv}
          onChange={(e) => setCsv(e.target.value)}
          slotProps={{ htmlInput: { 'aria-label': 'CSV text' } }}
        />
        {importer.isError && <Alert severity="error">{describeError(importer.error)}</Alert>}
        {result && result.imported > 0 && (
          <Alert severity="success">Imported {result.imported} contacts.</Alert>
        )}
        {result && result.problems.length > 0 && (
          <Alert severity="error" role="alert">
            Nothing was imported. Fix these and import again:
            <ul style={{ margin: 0 }} data-testid="import-problems">
              {result.problems.map((p) => (
                <li key={p.message}>{p.message}</li>
              ))}
            </ul>
          </Alert>
        )}
      </DialogContent>
      <DialogActions>
        <Button onClick={onClose}>Close</Button>
        <Button
          variant="contained"
          disabled={!csv.trim() || importer.isPending}
          onClick={() => importer.mutate(csv)}
        >
          Import
        </Button>
      </DialogActions>
    </Dialog>
  );
}
