// Console clients for the scale-out check: socket.io connections to one gateway each, following
// a reservoir's live readings and the logbook, recording what each was pushed.
import { io } from 'socket.io-client';

const LIVE_NAMESPACE = '/live';

async function ack(socket, event, payload) {
  const answer = await socket.timeout(10_000).emitWithAck(event, ...(payload ? [payload] : []));
  if (!answer?.ok) throw new Error(`${event} refused: ${JSON.stringify(answer)}`);
}

/** A client on `baseUrl`, subscribed to the reservoir's readings and following the logbook. */
export async function connectConsole(baseUrl, token, reservoirId, label) {
  const socket = io(`${baseUrl}${LIVE_NAMESPACE}`, {
    transports: ['websocket'],
    auth: { token },
    reconnection: false,
  });
  const readings = new Set();
  const logbook = new Set();
  let repeatedReadings = 0;
  socket.on('readings', (batch) => {
    for (const r of batch) {
      const key = `${r.deviceId}/${r.channel}/${r.seq}`;
      if (readings.has(key)) repeatedReadings += 1;
      readings.add(key);
    }
  });
  socket.on('logbook-entry', (entry) => logbook.add(entry.id));
  await new Promise((resolve, reject) => {
    socket.once('connect', resolve);
    socket.once('connect_error', reject);
  });
  await ack(socket, 'subscribe', { reservoirId });
  await ack(socket, 'logbook-follow');
  return {
    label,
    readings,
    logbook,
    repeats: () => repeatedReadings,
    close: () => socket.close(),
  };
}

/** Signs in through the API; the token is good on every gateway (one JWT_SECRET, one database). */
export async function signIn(baseUrl, username, password) {
  const res = await fetch(`${baseUrl}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ username, password }),
  });
  if (res.status !== 200 && res.status !== 201)
    throw new Error(`sign-in ${res.status}: ${await res.text()}`);
  return (await res.json()).accessToken;
}

/** Writes a shift note through one gateway; resolves to the logbook entry's id. */
export async function writeShiftNote(baseUrl, token, text) {
  const form = new FormData();
  form.append('text', text);
  const res = await fetch(`${baseUrl}/api/logbook/shift-notes`, {
    method: 'POST',
    headers: { Authorization: `Bearer ${token}` },
    body: form,
  });
  if (res.status !== 201) throw new Error(`shift note ${res.status}: ${await res.text()}`);
  return (await res.json()).id;
}

/** The ingestion counters of one gateway since it started. */
export async function countersOf(baseUrl, token) {
  const res = await fetch(`${baseUrl}/api/telemetry/counters`, {
    headers: { Authorization: `Bearer ${token}` },
  });
  if (res.status !== 200) throw new Error(`counters ${res.status}: ${await res.text()}`);
  return res.json();
}
