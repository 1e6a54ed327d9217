/**
 * What the sync client takes from the platform — the network, the clock, chance and timers — in one
 * place, so the unit tests can hand it a fake server and a controlled clock (test/web/sync*.test.ts).
 */
import type { Caller } from './api.ts';

export interface SyncDeps extends Caller {
  random: () => number;
  setTimer: (fn: () => void, ms: number) => unknown;
  clearTimer: (handle: unknown) => void;
}

export const deps: SyncDeps = {
  fetch: (url, init) => globalThis.fetch(url, init),
  now: () => new Date(),
  random: () => Math.random(),
  setTimer: (fn, ms) => setTimeout(fn, ms),
  clearTimer: (handle) => clearTimeout(handle as ReturnType<typeof setTimeout>),
};

/** For tests: replace some of the platform's parts (pass the originals back to restore). */
export function setSyncDeps(parts: Partial<SyncDeps>): void {
  Object.assign(deps, parts);
}

/**
 * The URL of an API path on a crew server. `server` is '' for the origin the app is served from, the only
 * server the app's content security policy lets it reach (web/sync/README.md).
 */
export function apiUrl(server: string, prefix: string, path: string): string {
  return `${server.replace(/\/+$/, '')}${prefix}${path}`;
}
