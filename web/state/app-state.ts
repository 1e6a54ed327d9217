/**
 * App-wide state that is not a study: connection trouble, the waiting update, whether anything is
 * half-typed (the update prompt waits while it is), persistence, the device id, and user settings.
 */
import type { PersistState } from '../storage/meta.ts';
import { store } from './store.ts';

/** Set when another tab upgraded the database: this page must reload before writing again. */
export const dbBlocked = store(false);
/** Accepts a waiting new version (sends SKIP_WAITING); null when none waits. */
export const updateWaiting = store<null | (() => void)>(null);
/** Shown once, when the app shell is first cached. */
export const offlineReady = store(false);
/** Keys of entry pads that hold something typed but not saved. */
const dirtyKeys = new Set<string>();
export const halfTyped = store(false);
export function setHalfTyped(key: string, dirty: boolean): void {
  if (dirty) dirtyKeys.add(key);
  else dirtyKeys.delete(key);
  halfTyped.set(dirtyKeys.size > 0);
}
export const persistState = store<PersistState | null>(null);
export const device = store<string>('');
let deviceWait: Promise<string> | null = null;
/** Bootstrap hands over the device id's read; the store is set when it arrives. */
export function deviceFrom(p: Promise<string>): void {
  deviceWait = p.then((id) => {
    device.set(id);
    return id;
  });
}
/** The device id, once read (at once when already known, or when no read was handed over: tests). */
export function deviceReady(): Promise<string> {
  return device.get() !== '' || deviceWait === null ? Promise.resolve(device.get()) : deviceWait;
}

export interface Settings {
  sun: boolean;
  sound: boolean;
  vibrate: boolean;
  /** Record position with each entry (asks the browser once). */
  position: boolean;
}
const LS_SETTINGS = 'sure-enough.settings';
const defaults: Settings = { sun: false, sound: true, vibrate: true, position: false };

function loadSettings(): Settings {
  try {
    const raw = JSON.parse(localStorage.getItem(LS_SETTINGS) ?? '{}') as Partial<
      Record<keyof Settings, unknown>
    >;
    const out = { ...defaults };
    for (const k of Object.keys(defaults) as (keyof Settings)[]) {
      if (typeof raw[k] === 'boolean') out[k] = raw[k] as boolean;
    }
    return out;
  } catch {
    return { ...defaults };
  }
}
export const settings = store<Settings>(loadSettings());
export function updateSettings(patch: Partial<Settings>): void {
  const next = { ...settings.get(), ...patch };
  settings.set(next);
  try {
    localStorage.setItem(LS_SETTINGS, JSON.stringify(next));
  } catch {
    /* preferences only */
  }
  applyTheme();
}
export function applyTheme(): void {
  if (typeof document !== 'undefined') document.documentElement.classList.toggle('sun', settings.get().sun);
}
