import { useEffect, useState } from 'react';

/** This computer's clock, re-read every intervalMs; only for measuring how long ago something arrived. */
export function useWallClock(intervalMs: number): number {
  const [now, setNow] = useState(() => Date.now());
  useEffect(() => {
    const id = window.setInterval(() => setNow(Date.now()), intervalMs);
    return () => window.clearInterval(id);
  }, [intervalMs]);
  return now;
}
