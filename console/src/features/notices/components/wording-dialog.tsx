import { useForm } from 'react-hook-form';
import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogTitle from '@mui/material/DialogTitle';
import TextField from '@mui/material/TextField';
import Typography from '@mui/material/Typography';
import {
  noticeEditSchema,
  TEMPLATE_FIELDS,
  type Notice,
  type NoticeEdit,
} from '@stillwell/shared/notices';
import { describeError } from '../../../lib/api-client';
import { useEditNotice } from '../api/edit-notice';
import { zodResolver } from '../utils/zod-resolver';

export interface WordingDialogProps {
  reservoirId: string;
  notice: Notice;
  onClose: () => void;
}

/** The liaison's wording of one notice; the figures and the link are added to every message anyway. */
export function WordingDialog({ reservoirId, notice, onClose }: WordingDialogProps) {
  const edit = useEditNotice(reservoirId);
  const form = useForm<NoticeEdit>({
    resolver: zodResolver(noticeEditSchema),
    defaultValues: { subject: notice.subject, template: notice.template },
  });
  const { errors } = form.formState;
  const submit = form.handleSubmit(async (values) => {
    await edit.mutateAsync({ noticeId: notice.id, edit: values });
    onClose();
  });
  return (
    <Dialog open onClose={onClose} maxWidth="md" fullWidth>
      <form onSubmit={(e) => void submit(e)} noValidate>
        <DialogTitle>Wording of the notice to {notice.zoneName}</DialogTitle>
        <DialogContent sx={{ display: 'grid', gap: 2, pt: 1 }}>
          <Typography variant="body2" sx={{ color: 'text.secondary' }}>
            Placeholders:{' '}
            {Object.entries(TEMPLATE_FIELDS)
              .map(([k, v]) => `{{${k}}} ${v}`)
              .join('; ')}
            . The figures and the personal acknowledgement link are added below the text of every
            message.
          </Typography>
          <TextField
            label="Subject"
            {...form.register('subject')}
            error={Boolean(errors.subject)}
            helperText={errors.subject?.message}
            sx={{ mt: 1 }}
          />
          <TextField
            label="Message"
            multiline
            minRows={8}
            {...form.register('template')}
            error={Boolean(errors.template)}
            helperText={errors.template?.message}
          />
          {edit.isError && <Alert severity="error">{describeError(edit.error)}</Alert>}
        </DialogContent>
        <DialogActions>
          <Button onClick={onClose}>Cancel</Button>
          <Button type="submit" variant="contained" disabled={form.formState.isSubmitting}>
            Save wording
          </Button>
        </DialogActions>
      </form>
    </Dialog>
  );
}
