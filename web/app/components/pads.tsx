/**
 * The entry pads: numbers (measurements), a counter (counts per plot) and two buttons (pass/fail).
 * A pad refuses bad input with a message that says what is wrong and where, and saves nothing then.
 * On a failed write the typed value stays in the pad; "Saved" appears only after the commit.
 */
import type { ComponentChildren } from 'preact';
import { type StateUpdater, useState } from 'preact/hooks';
import { NOTE_MAX, parseCount, parseMeasurement } from '../../input/parse.ts';
import type { NewEntry } from '../../storage/observations.ts';
import { type Sep, sepName } from '../number-style.ts';
import { KeepPrompt, PadMessage, SavingSlot, useSaver } from './pad-save.tsx';

export interface PadProps {
  disabled: boolean;
  /** The field screen's Undo-last button, placed in the pad's bottom row. */
  undo?: ComponentChildren;
  /** Resolves with the saved entry's seq (and a warning, e.g. a coarse position) once committed; rejects with a readable message. */
  onSave(entry: NewEntry): Promise<{ seq: number; warning?: string }>;
  /** The "keep it?" question for an implausible value, or null (see ../plausible.ts). */
  check?(value: number): string | null;
  /** The study's decimal separator. */
  sep?: Sep;
}

function useNote() {
  const [note, setNote] = useState('');
  const [open, setOpen] = useState(false);
  const clear = () => {
    setNote('');
    setOpen(false);
  };
  return { note, setNote, open, setOpen, clear };
}

type Note = ReturnType<typeof useNote>;

function NoteBox(props: { note: string; setNote(v: string): void; id: string }) {
  const over = props.note.trim().length > NOTE_MAX;
  return (
    <div class="note-box">
      <label for={props.id}>Note for the next entry</label>
      <textarea
        id={props.id}
        rows={2}
        value={props.note}
        onInput={(e) => props.setNote((e.currentTarget as HTMLTextAreaElement).value)}
      />
      <span class={over ? 'count over' : 'count'}>
        {props.note.trim().length} / {NOTE_MAX}
      </span>
    </div>
  );
}

/** The label of a pad's Save button while loading, or ready ("Saving…" is written into its slot). */
function saveLabel(disabled: boolean, ready: string): string {
  return disabled ? 'Loading…' : ready;
}

/** The pad as a form: Enter or the Save button submits, and the page never reloads. */
function PadForm(props: { onSubmit(): void; children: ComponentChildren; cls?: string }) {
  return (
    <form
      class={`pad ${props.cls ?? ''}`}
      aria-label="Entry pad"
      onSubmit={(e) => {
        e.preventDefault();
        props.onSubmit();
      }}
    >
      {props.children}
    </form>
  );
}

/** The typed value: a labelled input (typing clears the last message) with its unit beside it. */
function PadDisplay(props: {
  id: string;
  label: ComponentChildren;
  inputMode: 'none' | 'numeric';
  text: string;
  setText(v: string): void;
  clearMsg(): void;
  disabled: boolean;
  unit: string;
  mark?: ComponentChildren;
  selectOnFocus?: boolean;
}) {
  return (
    <div class="pad-display">
      <label for={props.id} class="sr-only">
        {props.label}
      </label>
      <div class="display-row">
        {props.mark}
        <input
          id={props.id}
          class="display"
          inputMode={props.inputMode}
          autoComplete="off"
          value={props.text}
          disabled={props.disabled}
          onFocus={props.selectOnFocus ? (e) => (e.currentTarget as HTMLInputElement).select() : undefined}
          onInput={(e) => {
            props.clearMsg();
            props.setText((e.currentTarget as HTMLInputElement).value);
          }}
        />
        <span class="unit">{props.unit}</span>
      </div>
    </div>
  );
}

function Key(props: { label: string; aria?: string; onPress(): void; disabled: boolean; cls?: string }) {
  return (
    <button
      type="button"
      class={`key ${props.cls ?? ''}`}
      aria-label={props.aria}
      disabled={props.disabled}
      onClick={props.onPress}
    >
      {props.label}
    </button>
  );
}

function NoteToggle(props: { note: Note; disabled: boolean; cls?: string }) {
  const n = props.note;
  const has = n.note.trim() !== '';
  return (
    <button
      type="button"
      class={`key small ${has ? 'on' : ''} ${props.cls ?? ''}`}
      aria-expanded={n.open}
      disabled={props.disabled}
      onClick={() => n.setOpen(!n.open)}
    >
      {has ? 'Note ✎' : 'Note'}
    </button>
  );
}

export function MeasurementPad(props: PadProps & { unit: string; reportingLimit?: number | undefined }) {
  const [text, setTextNow] = useState('');
  const [censored, setCensored] = useState(false);
  const n = useNote();
  const dirty = text !== '' || n.note.trim() !== '';
  const saver = useSaver(props, 'measurement', dirty, n);
  const { msg, setMsg, save } = saver;
  // the keys are not disabled while a save is in flight (that would re-render the pad on the tap path);
  // their edits are ignored instead, so a key never lands in the value being saved
  const setText = (v: StateUpdater<string>) => {
    if (!saver.saving()) setTextNow(v);
  };
  const off = props.disabled;
  const sep = props.sep ?? '.';
  const type = (s: string) => {
    setMsg(null);
    setText((t) => (t + s).slice(0, 40));
  };
  // a minus only starts a number: pressed after digits it would build "5−3" into −53
  const minus = () => {
    setMsg(null);
    if (text === '') setText('-');
    else if (text === '-') setText('');
    else
      setMsg({
        kind: 'error',
        text: 'A minus sign can only come first: delete the digits (⌫) to key in a negative value.',
      });
  };
  const submit = () => {
    const p = parseMeasurement(text, 'Value', props.sep);
    void save(
      p.ok ? { value: p.value, ...(censored ? { censored: true } : {}) } : { error: p.message },
      () => {
        setTextNow('');
        setCensored(false);
      },
      `${censored ? '< ' : ''}${p.ok ? String(p.value).replace('.', sep) : text.trim()} ${props.unit}`.trim(),
    );
  };
  const toggleRl = () => {
    if (saver.saving()) return;
    setCensored((c) => !c);
    if (!censored && text === '' && props.reportingLimit !== undefined) setText(String(props.reportingLimit));
  };
  return (
    <PadForm onSubmit={submit} cls="measure">
      <PadDisplay
        id="value-input"
        label={`${censored ? 'Reporting limit (result below it)' : 'Value'}${props.unit ? ` in ${props.unit}` : ''}`}
        inputMode="none"
        text={text}
        setText={setText}
        clearMsg={() => setMsg(null)}
        disabled={props.disabled}
        unit={props.unit}
        mark={censored && <span class="rl-mark">&lt;</span>}
      />
      {n.open && <NoteBox note={n.note} setNote={n.setNote} id="note-measurement" />}
      <PadMessage msg={msg} at={saver.line} />
      <KeepPrompt pending={saver.pending} keep={saver.keep} change={saver.change} />
      <div class="keys" hidden={!!saver.pending}>
        {['7', '8', '9'].map((k) => (
          <Key key={k} label={k} onPress={() => type(k)} disabled={off} />
        ))}
        <Key
          label="⌫"
          aria="Delete last character"
          onPress={() => setText((t) => t.slice(0, -1))}
          disabled={off}
        />
        {['4', '5', '6'].map((k) => (
          <Key key={k} label={k} onPress={() => type(k)} disabled={off} />
        ))}
        <Key label={sep} aria={sepName(sep)} onPress={() => type(sep)} disabled={off} />
        {['1', '2', '3'].map((k) => (
          <Key key={k} label={k} onPress={() => type(k)} disabled={off} />
        ))}
        <Key label="−" aria="Minus sign" onPress={minus} disabled={off} />
        <button
          type="button"
          class={`key small ${censored ? 'on' : ''}`}
          aria-pressed={censored}
          disabled={off}
          onClick={toggleRl}
        >
          below RL
        </button>
        <Key label="0" onPress={() => type('0')} disabled={off} cls="wide" />
        <NoteToggle note={n} disabled={off} cls="note-key" />
      </div>
      <div class="save-row" hidden={!!saver.pending}>
        {props.undo}
        <button type="submit" class="save" disabled={off}>
          <SavingSlot slot={saver.slot}>{saveLabel(props.disabled, 'Save')}</SavingSlot>
        </button>
      </div>
    </PadForm>
  );
}

export function CountPad(props: PadProps) {
  const [text, setTextNow] = useState('0');
  const n = useNote();
  const dirty = (text !== '0' && text !== '') || n.note.trim() !== '';
  const saver = useSaver(props, 'count', dirty, n);
  const { msg, setMsg, save } = saver;
  // edits are ignored while a save is in flight, as on the measurement pad
  const setText = (v: StateUpdater<string>) => {
    if (!saver.saving()) setTextNow(v);
  };
  const off = props.disabled;
  const parsed = parseCount(text);
  const step = (d: number) => {
    setMsg(null);
    const cur = parsed.ok ? parsed.value : 0;
    setText(String(Math.max(0, cur + d)));
  };
  const submit = () => {
    const p = parseCount(text, 'Count');
    void save(
      p.ok ? { value: p.value } : { error: p.message },
      () => setTextNow('0'),
      `${text.trim()} in the plot`,
    );
  };
  return (
    <PadForm onSubmit={submit}>
      <PadDisplay
        id="count-input"
        label="Count in this plot"
        inputMode="numeric"
        text={text}
        setText={setText}
        clearMsg={() => setMsg(null)}
        disabled={props.disabled}
        unit="per plot"
        selectOnFocus
      />
      {n.open && <NoteBox note={n.note} setNote={n.setNote} id="note-count" />}
      <PadMessage msg={msg} at={saver.line} />
      <KeepPrompt pending={saver.pending} keep={saver.keep} change={saver.change} />
      <div class="counter" hidden={!!saver.pending}>
        <button
          type="button"
          class="key minus"
          aria-label="Minus one"
          disabled={off}
          onClick={() => step(-1)}
        >
          −1
        </button>
        <button type="button" class="key plus" aria-label="Plus one" disabled={off} onClick={() => step(1)}>
          +1
        </button>
      </div>
      <div class="row2">
        <button type="button" class="key small" disabled={off} onClick={() => setText('0')}>
          Zero
        </button>
        <NoteToggle note={n} disabled={off} />
        {props.undo}
      </div>
      <button type="submit" class="save" disabled={off}>
        <SavingSlot slot={saver.slot}>
          {saveLabel(props.disabled, `Save plot: ${parsed.ok ? parsed.value : text}`)}
        </SavingSlot>
      </button>
    </PadForm>
  );
}

export function PassFailPad(props: PadProps & { outcome: string; other: string }) {
  const n = useNote();
  const { msg, slot, line, save } = useSaver(props, 'pass-fail', n.note.trim() !== '', n, false);
  const off = props.disabled;
  const press = (value: 0 | 1) => save({ value }, () => undefined, value ? props.outcome : props.other);
  return (
    <fieldset class="pad">
      <legend class="sr-only">Entry pad</legend>
      {n.open && <NoteBox note={n.note} setNote={n.setNote} id="note-pf" />}
      <PadMessage msg={msg} at={line} />
      <p class="pad-hint">
        <SavingSlot slot={slot}>Each tap saves one item.</SavingSlot>
      </p>
      <div class="pf">
        <PfButton cls="yes" onPress={() => press(1)} disabled={off} mark="✕">
          {props.outcome}
        </PfButton>
        <PfButton cls="no" onPress={() => press(0)} disabled={off} mark="✓">
          {props.other}
        </PfButton>
      </div>
      <div class="row2">
        <NoteToggle note={n} disabled={off} />
        {props.undo}
      </div>
    </fieldset>
  );
}

function PfButton(props: {
  cls: string;
  onPress(): void;
  disabled: boolean;
  mark: string;
  children: ComponentChildren;
}) {
  return (
    <button type="button" class={`pf-btn ${props.cls}`} disabled={props.disabled} onClick={props.onPress}>
      <span class="mark" aria-hidden="true">
        {props.mark}
      </span>
      <span>{props.children}</span>
    </button>
  );
}
