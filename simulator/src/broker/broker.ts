import { Aedes, type AedesOptions } from 'aedes';
import { createServer, type Socket } from 'node:net';

/**
 * Hooks a later issue fills in (device credentials, topic rules). Each has aedes' own signature;
 * leaving one out keeps aedes' default, which allows everything.
 */
export type BrokerPolicy = Pick<
  AedesOptions,
  'authenticate' | 'authorizePublish' | 'authorizeSubscribe'
>;

export interface BrokerOptions {
  /** 0 picks a free port */
  port: number;
  /** loopback unless told otherwise: an open broker must not face a network */
  host?: string;
  policy?: BrokerPolicy;
}

export interface RunningBroker {
  port: number;
  host: string;
  /** resolves when every client is gone and the port is released */
  close(): Promise<void>;
}

export async function startBroker(options: BrokerOptions): Promise<RunningBroker> {
  const host = options.host ?? '127.0.0.1';
  const aedes = await Aedes.createBroker({ ...options.policy });
  const sockets = new Set<Socket>();
  const server = createServer((socket) => {
    sockets.add(socket);
    socket.on('close', () => sockets.delete(socket));
    aedes.handle(socket);
  });
  try {
    await new Promise<void>((resolve, reject) => {
      server.once('error', reject);
      server.listen(options.port, host, () => {
        server.off('error', reject);
        resolve();
      });
    });
  } catch (error) {
    await new Promise<void>((resolve) => aedes.close(() => resolve()));
    throw error;
  }
  const address = server.address();
  const port = typeof address === 'object' && address ? address.port : options.port;

  let closing: Promise<void> | undefined;
  const close = () => {
    closing ??= (async () => {
      const serverClosed = new Promise<void>((resolve) => server.close(() => resolve()));
      await new Promise<void>((resolve) => aedes.close(() => resolve()));
      // aedes ends its clients; a socket that lingers would keep server.close() waiting.
      for (const s of sockets) s.destroy();
      await serverClosed;
    })();
    return closing;
  };
  return { port, host, close };
}
