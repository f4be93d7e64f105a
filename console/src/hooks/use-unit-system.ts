import { useCallback, useSyncExternalStore } from 'react';
import type { UnitSystem } from '@stillwell/shared/units';

export const UNIT_SYSTEM_STORAGE_KEY = 'stillwell.unitSystem';

const listeners = new Set<() => void>();
/** Used only where the browser refuses storage (policy, private mode): the choice lasts the tab. */
let unstored: UnitSystem = 'si';

function readUnitSystem(): UnitSystem {
  try {
    return localStorage.getItem(UNIT_SYSTEM_STORAGE_KEY) === 'us' ? 'us' : 'si';
  } catch {
    return unstored;
  }
}

function subscribe(listener: () => void): () => void {
  listeners.add(listener);
  // Another tab of the console changing the choice counts too.
  const onStorage = (event: StorageEvent) => {
    if (event.key === UNIT_SYSTEM_STORAGE_KEY) listener();
  };
  window.addEventListener('storage', onStorage);
  return () => {
    listeners.delete(listener);
    window.removeEventListener('storage', onStorage);
  };
}

export function setUnitSystem(system: UnitSystem): void {
  unstored = system;
  try {
    localStorage.setItem(UNIT_SYSTEM_STORAGE_KEY, system);
  } catch {
    // Not remembered past this tab; the choice still applies.
  }
  listeners.forEach((listener) => listener());
}

/** The display unit system (SI is the default), remembered in this browser; every screen reads the same one. */
export function useUnitSystem(): [UnitSystem, (system: UnitSystem) => void] {
  const system = useSyncExternalStore(subscribe, readUnitSystem, () => 'si' as const);
  const set = useCallback((next: UnitSystem) => setUnitSystem(next), []);
  return [system, set];
}
