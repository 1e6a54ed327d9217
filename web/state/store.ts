/** A tiny observable value (instead of a state library): get, set, subscribe, and a Preact hook. */
import { useEffect, useState } from 'preact/hooks';

export interface Store<T> {
  get(): T;
  set(v: T): void;
  subscribe(fn: (v: T) => void): () => void;
}

export function store<T>(initial: T): Store<T> {
  let value = initial;
  const subs = new Set<(v: T) => void>();
  return {
    get: () => value,
    set(v) {
      if (Object.is(v, value)) return;
      value = v;
      for (const fn of subs) fn(v);
    },
    subscribe(fn) {
      subs.add(fn);
      return () => subs.delete(fn);
    },
  };
}

/** Subscribes a component to a store. Values are boxed: a stored function must not be taken for a state updater. */
export function useStore<T>(s: Store<T>): T {
  const [box, setBox] = useState(() => ({ v: s.get() }));
  useEffect(() => {
    // a value set between the render and this effect; the same value renders nothing again
    setBox((b) => (Object.is(b.v, s.get()) ? b : { v: s.get() }));
    return s.subscribe((v) => setBox({ v }));
  }, [s]);
  return box.v;
}
