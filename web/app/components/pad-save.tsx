/**
 * The pads' shared save flow: validate the note, ask "keep it?" when a value looks implausible (never
 * refuse or change it), save, keep everything on a failed write, clear (value and note) on success, and
 * say what was saved — with a warning when the position was coarse.
 *
 * The tap path draws as little as it can: "Saving…" is written straight into its own slot (SavingSlot) and
 * nothing else re-renders before the write, and a second tap while a save is in flight is refused in the
 * handler (no re-render of the whole pad disabled). "Saved #k" is the pad's one re-render, after the commit.
 */
import type { ComponentChildren, RefObject } from 'preact';
import { useEffect, useRef, useState } from 'preact/hooks';
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

/** The pad's message line; `at` lets the save flow write "Saved #k" into it directly (see `showSaved`). */
export function PadMessage({ msg, at }: { msg: Msg; at?: RefObject<HTMLParagraphElement | null> }) {
  return (
    <>
      <p
        ref={at}
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

/**
 * A label with a slot for "Saving…": the slot is written directly while a save is in flight (no render),
 * and its parent then carries `data-saving`, which hides the label (web/styles/field.css). Preact never
 * renders into the slot nor that attribute, so the two never fight.
 */
export function SavingSlot(props: { slot: RefObject<HTMLSpanElement | null>; children: ComponentChildren }) {
  return (
    <>
      <span class="save-label">{props.children}</span>
      <span class="save-busy" ref={props.slot} />
    </>
  );
}

function showSaving(slot: HTMLSpanElement | null, on: boolean): void {
  if (!slot) return;
  slot.textContent = on ? 'Saving…' : '';
  slot.parentElement?.toggleAttribute('data-saving', on);
}

/**
 * Writes "Saved #k" into the message line at once, as the pad's next render will (same text, class and
 * attribute), so that the frame after the commit shows it without waiting for that render. The text goes
 * into the line's own text node, which the render then sets to the same words. False when the line is not
 * there as rendered (the render then says it).
 */
function showSaved(line: HTMLParagraphElement | null, text: string): boolean {
  const node = line?.firstChild;
  if (!line || !(node instanceof Text) || node.nextSibling !== null) return false;
  node.data = text;
  line.className = 'pad-msg saved';
  line.setAttribute('data-committed', '1');
  return true;
}

/** Runs `fn` after the next frame has been painted (or soon, where there are no frames). */
function afterFrame(fn: () => void): void {
  if (typeof requestAnimationFrame === 'function') requestAnimationFrame(() => setTimeout(fn, 0));
  else setTimeout(fn, 0);
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

/** `holdsValue`: the pad keeps a typed value until it is saved (measurement, count), unlike pass/fail. */
export function useSaver(props: PadProps, padKey: string, dirty: boolean, note: Note, holdsValue = true) {
  const [msg, setMsg] = useState<Msg>(null);
  const [pending, setPending] = useState<Pending | null>(null);
  /** True while a save is in flight: a second tap then does nothing (one tap, one entry). */
  const inFlight = useRef(false);
  /** The "Saving…" slot of the pad's save control (SavingSlot), and the message line (PadMessage). */
  const slot = useRef<HTMLSpanElement>(null);
  const line = useRef<HTMLParagraphElement>(null);
  useEffect(() => {
    setHalfTyped(padKey, dirty);
  }, [padKey, dirty]);
  useEffect(() => () => setHalfTyped(padKey, false), [padKey]);
  async function commit(entry: NewEntry, onDone: () => void, what: string, text: string) {
    if (inFlight.current) return;
    inFlight.current = true;
    // the write is asked for first; "Saving…" is one text written into its slot, shown in the next frame
    const saving = props.onSave(text ? { ...entry, note: text } : entry);
    showSaving(slot.current, true);
    let saved: Awaited<typeof saving>;
    try {
      saved = await saving;
    } catch (err) {
      showSaving(slot.current, false);
      setMsg({ kind: 'error', text: (err as Error).message });
      inFlight.current = false;
      return;
    }
    // committed: "Saved #k" now, written into its line; the pad's render (clearing the value and the note)
    // follows that frame. Until then a second tap and any edit are refused (they would save or change the
    // value just saved); the pass/fail pad holds no value, and each of its taps is a new item.
    const words = `Saved #${saved.seq}: ${what}`;
    showSaving(slot.current, false);
    if (!holdsValue && !text) inFlight.current = false;
    const done = () => {
      onDone();
      note.clear();
      setMsg({ kind: 'saved', text: words, ...(saved.warning ? { warning: saved.warning } : {}) });
      inFlight.current = false;
    };
    if (showSaved(line.current, words)) afterFrame(done);
    else done();
  }
  async function save(entry: NewEntry | { error: string }, onDone: () => void, what: string) {
    if (inFlight.current) return;
    if (pending !== null) setPending(null);
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
  /** True while a save is in flight: the pads ignore edits then, so a key never lands in the value being saved. */
  const saving = () => inFlight.current;
  return { msg, setMsg, slot, line, save, saving, pending, keep, change: () => setPending(null) };
}
