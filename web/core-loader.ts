/**
 * The statistics core (src/, with jstat) is its own chunk, so the app shell (screens, storage,
 * service-worker registration) stays within the 60 KB budget. web/main.tsx starts fetching it at once, in
 * parallel with the database open and the first render (it never blocks the first paint). Every screen that
 * shows figures loads a study from IndexedDB, which is asynchronous anyway, and awaits `loadCore()` on the
 * same path; the service worker precaches the chunk, so it is there offline.
 *
 * Only type imports of ./core.ts are allowed elsewhere in web/: a value import would pull the whole core
 * back into the shell chunk. Light helpers with no statistics live in ./core-light.ts.
 */
type Core = typeof import('./core.ts');

let pending: Promise<Core> | null = null;
let ready: Core | null = null;

export function loadCore(): Promise<Core> {
  pending ??= import('./core.ts').then((m) => {
    ready = m;
    return m;
  });
  return pending;
}

/** The core, for code that only runs after a study was loaded through `loadCore()`. */
export function loadedCore(): Core {
  if (ready === null) throw new Error('loadedCore requires loadCore() to have finished');
  return ready;
}
