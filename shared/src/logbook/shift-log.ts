import { z } from 'zod';
import { idSchema } from '../telemetry/message.js';

/** The operators' own entries: shift notes and handovers (free text, with attachments). */
export const shiftNoteFieldsSchema = z.strictObject({
  text: z.string().trim().min(1, 'write something').max(4000),
  /** gates or valves the note is about, so that the gate filter finds it */
  controls: z.array(idSchema).max(16).optional(),
});
export type ShiftNoteFields = z.infer<typeof shiftNoteFieldsSchema>;

export const handoverFieldsSchema = z.strictObject({
  /** who takes over: their user name, or their name as written in the handover */
  to: z.string().trim().min(2, 'name who takes over').max(100),
  text: z.string().trim().min(1, 'write the handover').max(4000),
  controls: z.array(idSchema).max(16).optional(),
});
export type HandoverFields = z.infer<typeof handoverFieldsSchema>;

/** Entry kinds, grouped for the logbook screen's filter ("order." matches every order.* kind). */
export const LOGBOOK_KIND_FILTERS: ReadonlyArray<{ value: string; label: string }> = [
  { value: 'order.', label: 'Gate orders (every step)' },
  { value: 'command.', label: 'Commands and acknowledgements' },
  { value: 'emergency.', label: 'Emergency declarations' },
  { value: 'automation.', label: 'Automatic rules and moves' },
  { value: 'shift.', label: 'Shift log and handovers' },
  { value: 'auth.', label: 'Sign-ins' },
  { value: 'user.', label: 'Accounts' },
  { value: 'config.', label: 'Configuration changes' },
];

/** socket.io on the live namespace: the logbook's own room, joined on request. */
export const LOGBOOK_LIVE_EVENTS = {
  /** client -> server, no payload; answered by an ack { ok, error? } */
  follow: 'logbook-follow',
  unfollow: 'logbook-unfollow',
  /** server -> client: LogbookEntry, after the transaction that wrote it committed */
  entry: 'logbook-entry',
} as const;
