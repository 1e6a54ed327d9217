/**
 * The statistics core (src/, with jstat) is its own chunk, so the app shell (screens, storage,
 * service-worker registration) stays within the 60 KB budget. It is loaded on first need: a screen that
 * reads a whole log awaits `loadCore()` in parallel with its storage reads; the field screen opened from
 * its running snapshot draws and enables Save without it and loads it after that first frame (its
 * compiling and running is the largest piece of work at start). The service worker precaches the chunk,
 * so it is there offline.
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

/** The core if it has loaded, else null (nothing is started). */
export function coreIfLoaded(): Core | null {
  return ready;
}

/** The core, for code that only runs after a study was loaded through `loadCore()`. */
export function loadedCore(): Core {
  if (ready === null) throw new Error('loadedCore requires loadCore() to have finished');
  return ready;
}
