import { z } from 'zod';

/**
 * Access on the live socket (namespace /live): the access token goes in the handshake
 * (`io(url, { auth: { token } })`). A connection without a valid one is refused with a
 * connect_error whose message is an AccessErrorCode. The server disconnects a socket when its
 * token expires, announcing it first with `auth-expired`; send a fresh token with `auth` before then.
 */
export const LIVE_AUTH_EVENTS = {
  /** client -> server: { token }, answered by an ack LiveAuthAck */
  auth: 'auth',
  /** server -> client: { code }, just before the server disconnects the socket */
  expired: 'auth-expired',
} as const;

export const liveAuthRequestSchema = z.strictObject({ token: z.string().min(1).max(4096) });
export type LiveAuthRequest = z.infer<typeof liveAuthRequestSchema>;

export interface LiveAuthAck {
  ok: boolean;
  /** when the socket's token now expires (ISO) */
  expiresAt?: string;
  error?: string;
}
