/**
 * The pads' shared save flow: validate the note, ask "keep it?" when a value looks implausible (never
 * refuse or change it), save, keep everything on a failed write, clear (value and note) on success, and
 * say what was saved — with a warning when the position was coarse.
 */
import { useEffect, useState } from 'preact/hooks';
import { checkNote } from '../../input/parse.ts';
import { setHalfTyped } from '../../state/app-state.ts';
import type { NewEntry } from '../../storage/observations.ts';
import type { PadProps } from './pads.tsx';

export type Msg = { kind: 'error' | 'saved'; text: string; warning?: string } | null;

export interface Note {
  note: string;
  clear(): void;
}

interface Pending {
  entry: NewEntry;
  onDone(): void;
  what: string;
  question: string;
}

export function PadMessage({ msg }: { msg: Msg }) {
  return (
    <>
      <p
        class={`pad-msg ${msg?.kind ?? ''}`}
        role={msg?.kind === 'error' ? 'alert' : 'status'}
        data-testid="pad-msg"
        data-committed={msg?.kind === 'saved' ? '1' : undefined}
      >
        {msg?.text ?? ''}
      </p>
      {msg?.warning && (
        <p class="pad-msg warning" role="alert" data-testid="pad-warning">
          {msg.warning}
        </p>
      )}
    </>
  );
}

/** The "keep it?" question: Keep saves the value as typed; Change goes back to the pad with it still there. */
export function KeepPrompt(props: { pending: Pending | null; keep(): void; change(): void }) {
  const p = props.pending;
  if (!p) return null;
  return (
    <div class="keep-prompt" role="alertdialog" aria-labelledby="keep-q" data-testid="keep-prompt">
      <p id="keep-q">
        {p.question} <strong>Keep it?</strong>
      </p>
      <div class="keep-actions">
        <button type="button" class="btn" onClick={props.change}>
          Change it
        </button>
        <button type="button" class="btn primary" onClick={props.keep}>
          Keep {p.what}
        </button>
      </div>
    </div>
  );
}

export function useSaver(props: PadProps, padKey: string, dirty: boolean, note: Note) {
  const [msg, setMsg] = useState<Msg>(null);
  const [busy, setBusy] = useState(false);
  const [pending, setPending] = useState<Pending | null>(null);
  useEffect(() => {
    setHalfTyped(padKey, dirty);
  }, [padKey, dirty]);
  useEffect(() => () => setHalfTyped(padKey, false), [padKey]);
  async function commit(entry: NewEntry, onDone: () => void, what: string, text: string) {
    // The write is asked for before "Saving…" is drawn: the storage opens its transaction in the first
    // microtask, ahead of the re-render that setBusy queues, so the commit runs while the frame is drawn
    // instead of after it. The word still shows in the frame after the tap.
    const saving = props.onSave(text ? { ...entry, note: text } : entry);
    setBusy(true);
    try {
      const saved = await saving;
      onDone();
      note.clear();
      setMsg({
        kind: 'saved',
        text: `Saved #${saved.seq}: ${what}`,
        ...(saved.warning ? { warning: saved.warning } : {}),
      });
    } catch (err) {
      setMsg({ kind: 'error', text: (err as Error).message });
    } finally {
      setBusy(false);
    }
  }
  async function save(entry: NewEntry | { error: string }, onDone: () => void, what: string) {
    setPending(null);
    if ('error' in entry) {
      setMsg({ kind: 'error', text: `${entry.error} Nothing was saved.` });
      return;
    }
    const n = checkNote(note.note);
    if (!n.ok) {
      setMsg({ kind: 'error', text: n.message });
      return;
    }
    const question = entry.censored ? null : (props.check?.(entry.value) ?? null);
    if (question) {
      setMsg(null);
      setPending({ entry, onDone, what, question });
      return;
    }
    await commit(entry, onDone, what, n.text);
  }
  const keep = () => {
    const p = pending;
    setPending(null);
    const n = checkNote(note.note);
    if (p && n.ok) void commit(p.entry, p.onDone, p.what, n.text);
  };
  return { msg, setMsg, busy, save, pending, keep, change: () => setPending(null) };
}
