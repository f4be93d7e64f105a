import { useEffect } from 'react';
import { session } from '../../../lib/auth-session';
import { useLiveSocket } from '../../../lib/live-connection';

/**
 * The gateway closes a live socket when its token runs out ("io server disconnect"), and socket.io
 * does not reconnect by itself after that. The session renews its token ahead of time, so connect
 * again at once: the handshake reads the renewed token.
 */
export function useLiveRenewal(): void {
  const socket = useLiveSocket();
  useEffect(() => {
    const onDisconnect = (reason: string) => {
      if (reason === 'io server disconnect' && session()) socket.connect();
    };
    socket.on('disconnect', onDisconnect);
    return () => socket.off('disconnect', onDisconnect);
  }, [socket]);
}
