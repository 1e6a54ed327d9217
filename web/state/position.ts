/**
 * Position from the Geolocation API while the field screen is open and the user allowed it. The latest
 * fix (with its accuracy radius, metres at 95 %) is attached to each entry if it is recent; otherwise
 * the entry has no position and the screen says "no fix" — never a guess.
 */
import type { Position } from '../core.ts';
import { store } from './store.ts';

export type PositionState =
  | { state: 'off' }
  | { state: 'waiting' }
  | { state: 'fix'; pos: Position; at: number }
  | { state: 'denied' }
  | { state: 'unavailable' };

/** A fix older than this is not attached to a new entry. */
export const FIX_MAX_AGE_MS = 2 * 60 * 1000;

export const position = store<PositionState>({ state: 'off' });
let watchId: number | null = null;

export function startPosition(): void {
  if (watchId !== null) return;
  if (!('geolocation' in navigator)) {
    position.set({ state: 'unavailable' });
    return;
  }
  position.set({ state: 'waiting' });
  watchId = navigator.geolocation.watchPosition(
    (p) =>
      position.set({
        state: 'fix',
        pos: { lat: p.coords.latitude, lon: p.coords.longitude, accuracyM: p.coords.accuracy },
        at: Date.now(),
      }),
    (err) => position.set({ state: err.code === err.PERMISSION_DENIED ? 'denied' : 'waiting' }),
    { enableHighAccuracy: true, maximumAge: 10_000, timeout: 60_000 },
  );
}

export function stopPosition(): void {
  if (watchId !== null) navigator.geolocation.clearWatch(watchId);
  watchId = null;
  position.set({ state: 'off' });
}

/** The fix to store with an entry now, or undefined ("no fix"). */
export function currentFix(): Position | undefined {
  const p = position.get();
  return p.state === 'fix' && Date.now() - p.at <= FIX_MAX_AGE_MS ? { ...p.pos } : undefined;
}

export function positionText(p: PositionState): string {
  switch (p.state) {
    case 'off':
      return 'GPS off';
    case 'waiting':
      return 'no fix';
    case 'denied':
      return 'no fix (not allowed)';
    case 'unavailable':
      return 'no fix (no GPS)';
    case 'fix':
      return `GPS ± ${Math.round(p.pos.accuracyM)} m`;
  }
}
