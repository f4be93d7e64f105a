import { useState } from 'react';
import { useForm } from 'react-hook-form';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import TextField from '@mui/material/TextField';
import Typography from '@mui/material/Typography';
import {
  totpCodeRequestSchema,
  type Me,
  type TotpBeginResponse,
  type TotpCodeRequest,
} from '@stillwell/shared/access';
import { Panel } from '../../../components/ui/panel';
import { describeError } from '../../../lib/api-client';
import { fonts } from '../../../theme';
import { beginTotp, removeTotp, useConfirmTotp } from '../api/totp';
import type { WithStepUp } from '../hooks/use-step-up';
import { zodResolver } from '../utils/zod-resolver';

export interface SecondFactorPanelProps {
  me: Me;
  withStepUp: WithStepUp;
}

/** Groups of four, as authenticator apps show a key typed by hand. */
const grouped = (secret: string) => secret.replace(/(.{4})/g, '$1 ').trim();

/** TOTP (RFC 6238): scan the QR code, type a code from it to turn it on; or turn it off. */
export function SecondFactorPanel({ me, withStepUp }: SecondFactorPanelProps) {
  const [enrolment, setEnrolment] = useState<TotpBeginResponse | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [turnedOn, setTurnedOn] = useState(false);

  const act = async (run: () => Promise<void>) => {
    setError(null);
    try {
      await run();
    } catch (e) {
      setError(describeError(e));
    }
  };
  const begin = () =>
    act(async () => {
      const started = await withStepUp('Adding a second factor', beginTotp);
      if (started) {
        setTurnedOn(false);
        setEnrolment(started);
      }
    });
  const remove = () =>
    act(async () => {
      await withStepUp('Turning the second factor off', removeTotp);
    });

  return (
    <Panel title="Second factor">
      {error && (
        <Alert severity="error" sx={{ mb: 2 }}>
          {error}
        </Alert>
      )}
      {me.totpEnabled ? (
        <Box sx={{ display: 'grid', gap: 2, justifyItems: 'start' }} data-testid="totp-on">
          {turnedOn && <Alert severity="success">The second factor is on.</Alert>}
          <Typography>
            On. Signing in and confirming an authorising act ask for a code from your authenticator
            app.
          </Typography>
          <Button color="warning" variant="outlined" onClick={() => void remove()}>
            Turn off
          </Button>
        </Box>
      ) : enrolment ? (
        <Enrolment
          enrolment={enrolment}
          onDone={() => {
            setEnrolment(null);
            setTurnedOn(true);
          }}
          onCancel={() => setEnrolment(null)}
        />
      ) : (
        <Box sx={{ display: 'grid', gap: 2, justifyItems: 'start' }} data-testid="totp-off">
          <Typography>
            Off. A code from an authenticator app on your phone, asked for with your password, keeps
            your account safe even if the password is learnt by someone else.
          </Typography>
          <Button variant="contained" onClick={() => void begin()} data-testid="totp-begin">
            Add an authenticator
          </Button>
        </Box>
      )}
    </Panel>
  );
}

interface EnrolmentProps {
  enrolment: TotpBeginResponse;
  onDone: () => void;
  onCancel: () => void;
}

function Enrolment({ enrolment, onDone, onCancel }: EnrolmentProps) {
  const confirm = useConfirmTotp();
  const form = useForm<TotpCodeRequest>({
    resolver: zodResolver(totpCodeRequestSchema),
    defaultValues: { code: '' },
  });
  const submit = form.handleSubmit(async ({ code }) => {
    try {
      await confirm.mutateAsync(code);
      onDone();
    } catch (e) {
      form.setError('code', { message: describeError(e) });
    }
  });
  const codeError = form.formState.errors.code?.message;
  return (
    <Box
      sx={{ display: 'grid', gridTemplateColumns: 'auto minmax(0, 1fr)', gap: 3 }}
      data-testid="totp-enrolment"
    >
      <Box
        component="img"
        src={enrolment.qrDataUrl}
        alt="QR code of the new key, for your authenticator app"
        data-testid="totp-qr"
        sx={{ width: 200, height: 200, bgcolor: '#fff', p: 1, borderRadius: 1 }}
      />
      <Box
        component="form"
        noValidate
        onSubmit={(e) => void submit(e)}
        sx={{ display: 'grid', gap: 1.5, alignContent: 'start' }}
      >
        <Typography>
          1. Scan the code with your authenticator app, or type the key into it by hand:
        </Typography>
        <Typography
          data-testid="totp-secret"
          sx={{ fontFamily: fonts.mono, fontSize: '0.95rem', wordBreak: 'break-all' }}
        >
          {grouped(enrolment.secret)}
        </Typography>
        <Typography variant="body2" sx={{ color: 'text.secondary' }}>
          Time-based, {enrolment.algorithm}, {enrolment.digits} digits, every {enrolment.period} s.
        </Typography>
        <Typography>2. Type the code it shows to turn the second factor on:</Typography>
        <TextField
          label="Code from the app"
          inputMode="numeric"
          autoComplete="one-time-code"
          {...form.register('code', { setValueAs: (v: string) => v.replace(/\s/g, '') })}
          error={!!codeError}
          helperText={codeError ?? 'six digits'}
          sx={{ maxWidth: 220 }}
        />
        <Box sx={{ display: 'flex', gap: 1 }}>
          <Button type="submit" variant="contained" disabled={form.formState.isSubmitting}>
            Turn on
          </Button>
          <Button onClick={onCancel}>Cancel</Button>
        </Box>
      </Box>
    </Box>
  );
}
