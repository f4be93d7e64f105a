import type { Socket } from 'socket.io';
import type { Action } from '@stillwell/shared/access';
import {
  describeIssues,
  subscribeRequestSchema,
  type SubscribeAck,
} from '@stillwell/shared/telemetry';
import type { LiveSocketAuth } from './live-socket-auth';

/** What a live feature's room is keyed on: one room per reservoir and feature. */
export interface ReservoirRoom {
  /** the permission that lets a socket join (re-checked on every join: roles change) */
  action: Action;
  room: (reservoirId: string) => string;
}

interface Reservoirs {
  find(reservoirId: string): unknown;
}

/**
 * Joins a socket to a reservoir's room of one feature, after checking the request, the session
 * and the permission, and that the reservoir exists. `joined` is the reservoir when it worked, so
 * the caller can send what the socket missed while it was away.
 */
export async function joinReservoirRoom(
  access: LiveSocketAuth,
  reservoirs: Reservoirs,
  target: ReservoirRoom,
  socket: Socket,
  body: unknown,
): Promise<{ ack: SubscribeAck; joined: string | null }> {
  const parsed = subscribeRequestSchema.safeParse(body);
  if (!parsed.success)
    return { ack: { ok: false, error: describeIssues(parsed.error) }, joined: null };
  const { reservoirId } = parsed.data;
  const refusal = await access.refusal(socket, target.action);
  if (refusal) return { ack: { ok: false, error: refusal }, joined: null };
  if (!reservoirs.find(reservoirId))
    return { ack: { ok: false, error: `No reservoir "${reservoirId}"` }, joined: null };
  await socket.join(target.room(reservoirId));
  return { ack: { ok: true }, joined: reservoirId };
}

/** Leaves a reservoir's room of one feature; leaving needs no permission. */
export async function leaveReservoirRoom(
  target: ReservoirRoom,
  socket: Socket,
  body: unknown,
): Promise<SubscribeAck> {
  const parsed = subscribeRequestSchema.safeParse(body);
  if (!parsed.success) return { ok: false, error: describeIssues(parsed.error) };
  await socket.leave(target.room(parsed.data.reservoirId));
  return { ok: true };
}
