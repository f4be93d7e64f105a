import { createHmac } from 'node:crypto';

/** Who may connect to the broker, and as what. The topic rules of each kind are in acl.ts. */
export type BrokerAccount =
  | { kind: 'gateway'; username: string; password: string }
  /** a field device: its own topics only, under its reservoir; connects with one client id */
  | {
      kind: 'device';
      username: string;
      password: string;
      reservoirId: string;
      deviceId: string;
      clientId: string;
    }
  /** the simulator's plant clock */
  | { kind: 'clock'; username: string; password: string; reservoirId: string; clientId: string };

export interface Credentials {
  username: string;
  password: string;
}

/**
 * The simulator's secrets: the gateway's account, and one secret from which each device's password
 * is derived (HMAC-SHA256 of the device's name), so the broker and the devices it starts agree
 * without a file of passwords. A real site provisions each device its own.
 */
export interface SimulatorCredentials {
  gateway: Credentials;
  deviceSecret: string;
}

/**
 * Fixed demo values, for a simulator started on its own on loopback (`npm start` passes random
 * ones to both the simulator and the gateway). The gateway's demo default matches.
 */
export const DEMO_CREDENTIALS: SimulatorCredentials = {
  gateway: { username: 'stillwell-gateway', password: 'orrin-gap-demo-only' },
  deviceSecret: 'orrin-gap-demo-device-secret',
};

/** Client ids the simulator's devices and clock connect with. */
export const deviceClientId = (deviceId: string) => `stillwell-sim-${deviceId}`;
export const CLOCK_CLIENT_ID = 'stillwell-sim-clock';
export const CLOCK_USERNAME = 'sim-clock';

export function derivedPassword(secret: string, reservoirId: string, name: string): string {
  return createHmac('sha256', secret)
    .update(`stillwell-broker:${reservoirId}:${name}`)
    .digest('base64url');
}

/** A device's (or the clock's) credentials; the username is the device id. */
export function deviceCredentials(
  c: SimulatorCredentials,
  reservoirId: string,
  deviceId: string,
): Credentials {
  return { username: deviceId, password: derivedPassword(c.deviceSecret, reservoirId, deviceId) };
}

export function clockCredentials(c: SimulatorCredentials, reservoirId: string): Credentials {
  return {
    username: CLOCK_USERNAME,
    password: derivedPassword(c.deviceSecret, reservoirId, CLOCK_USERNAME),
  };
}

/** Every account the broker of one reservoir's simulator knows. */
export function brokerAccounts(
  c: SimulatorCredentials,
  reservoirId: string,
  deviceIds: readonly string[],
): BrokerAccount[] {
  return [
    { kind: 'gateway', ...c.gateway },
    ...deviceIds.map((deviceId) => ({
      kind: 'device' as const,
      ...deviceCredentials(c, reservoirId, deviceId),
      reservoirId,
      deviceId,
      clientId: deviceClientId(deviceId),
    })),
    { kind: 'clock', ...clockCredentials(c, reservoirId), reservoirId, clientId: CLOCK_CLIENT_ID },
  ];
}

/**
 * The credentials from the environment (SIM_GATEWAY_USERNAME, SIM_GATEWAY_PASSWORD,
 * SIM_DEVICE_SECRET), the demo values for what is unset; `demo` says whether any demo value is used.
 */
export function credentialsFromEnv(env: NodeJS.ProcessEnv): {
  credentials: SimulatorCredentials;
  demo: boolean;
} {
  const username = env.SIM_GATEWAY_USERNAME || DEMO_CREDENTIALS.gateway.username;
  const password = env.SIM_GATEWAY_PASSWORD || DEMO_CREDENTIALS.gateway.password;
  const deviceSecret = env.SIM_DEVICE_SECRET || DEMO_CREDENTIALS.deviceSecret;
  return {
    credentials: { gateway: { username, password }, deviceSecret },
    demo: !env.SIM_GATEWAY_PASSWORD || !env.SIM_DEVICE_SECRET,
  };
}
