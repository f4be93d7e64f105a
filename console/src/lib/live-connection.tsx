import { createContext, useContext, useEffect, useState, type ReactNode } from 'react';
import type { LiveSocket } from './live-socket';
import { onSessionChange } from './auth-session';

/** connecting: never connected yet; reconnecting: lost and retrying; offline: not trying. */
export type LiveConnectionState = 'connecting' | 'connected' | 'reconnecting' | 'offline';

const SocketContext = createContext<LiveSocket | null>(null);
const StateContext = createContext<LiveConnectionState>('connecting');

export interface LiveConnectionProviderProps {
  socket: LiveSocket;
  children: ReactNode;
}

/** Opens the live connection for the whole app and tracks its state. */
export function LiveConnectionProvider({ socket, children }: LiveConnectionProviderProps) {
  const [state, setState] = useState<LiveConnectionState>(
    socket.connected ? 'connected' : 'connecting',
  );

  useEffect(() => {
    const lost = () => setState(socket.active && navigator.onLine ? 'reconnecting' : 'offline');
    const onConnect = () => setState('connected');
    const onBrowserOnline = () => setState(socket.connected ? 'connected' : 'reconnecting');
    socket.on('connect', onConnect);
    socket.on('disconnect', lost);
    socket.on('connect_error', lost);
    window.addEventListener('offline', lost);
    window.addEventListener('online', onBrowserOnline);
    socket.connect();
    // a handshake refused before sign-in is not retried by socket.io: connect again with the new token
    const stopWatching = onSessionChange((next) => {
      if (next && !socket.connected) {
        socket.disconnect();
        socket.connect();
      }
    });
    return () => {
      stopWatching();
      socket.off('connect', onConnect);
      socket.off('disconnect', lost);
      socket.off('connect_error', lost);
      window.removeEventListener('offline', lost);
      window.removeEventListener('online', onBrowserOnline);
      socket.disconnect();
    };
  }, [socket]);

  return (
    <SocketContext.Provider value={socket}>
      <StateContext.Provider value={state}>{children}</StateContext.Provider>
    </SocketContext.Provider>
  );
}

export function useLiveSocket(): LiveSocket {
  const socket = useContext(SocketContext);
  if (!socket) throw new Error('useLiveSocket needs a LiveConnectionProvider');
  return socket;
}

export function useLiveConnectionState(): LiveConnectionState {
  return useContext(StateContext);
}
