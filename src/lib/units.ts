/**
 * The viewer's unit system for lengths and temperatures (metric or imperial), kept in this browser and
 * shared by every page that shows one. The API takes both (`oneWayLengthM` or `oneWayLengthFt`); a
 * temperature is sent in °C and shown in °F when imperial is chosen.
 */
import { useSyncExternalStore } from 'react';

export type UnitSystem = 'metric' | 'imperial';

const STORAGE_KEY = 'ohmstead.unitSystem';
const listeners = new Set<() => void>();

function read(): UnitSystem {
  try {
    return localStorage.getItem(STORAGE_KEY) === 'metric' ? 'metric' : 'imperial';
  } catch {
    return 'imperial';
  }
}

let current: UnitSystem | undefined;

export function setUnitSystem(next: UnitSystem): void {
  current = next;
  try {
    localStorage.setItem(STORAGE_KEY, next);
  } catch {
    // Private mode: the choice lasts for this page only.
  }
  for (const l of listeners) l();
}

export function useUnitSystem(): UnitSystem {
  return useSyncExternalStore(
    (onChange) => {
      listeners.add(onChange);
      return () => listeners.delete(onChange);
    },
    () => (current ??= read()),
    () => 'imperial',
  );
}
