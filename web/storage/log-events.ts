/**
 * "A study's log grew": told after a write to the log has committed (an entry, a void, a correction, an
 * import), so that work which follows a save — the crew server sync (web/sync) — can be scheduled without
 * the tap path knowing about it. Listeners run synchronously and must only schedule work (a timer), never
 * do it: the save's caller is still waiting to say "Saved".
 */
const listeners = new Set<(studyId: string) => void>();

export function onLogWrite(fn: (studyId: string) => void): () => void {
  listeners.add(fn);
  return () => listeners.delete(fn);
}

/** Called by the log's writers after their transaction committed. */
export function logWritten(studyId: string): void {
  for (const fn of listeners) {
    try {
      fn(studyId);
    } catch {
      /* a listener's failure must never turn a committed save into an error */
    }
  }
}
