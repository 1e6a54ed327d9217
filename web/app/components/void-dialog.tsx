/**
 * Undo last / correct: both are voids with a reason; "correct" also takes the new value. The original
 * entry stays in the log, struck through. Bad input is refused with a message; nothing is saved then.
 */
import { useState } from 'preact/hooks';
import type { ObservationRecord } from '../../core.ts';
import { checkReason, parseCount, parseMeasurement } from '../../input/parse.ts';
import type { NewEntry } from '../../storage/observations.ts';
import { Modal } from './modal.tsx';

const REASONS = ['wrong key', 'wrong plot or item', 'entered twice', 'instrument error'];

export interface VoidDialogProps {
  mode: 'undo' | 'void' | 'correct';
  target: ObservationRecord;
  kind: 'measurement' | 'count' | 'pass-fail';
  describe(r: ObservationRecord): string;
  outcome: string;
  /** The other pass/fail result in the study's words (default "no " + outcome). */
  other?: string;
  onCancel(): void;
  onVoid(reason: string): Promise<unknown>;
  onCorrect(reason: string, entry: NewEntry): Promise<unknown>;
}

export function VoidDialog(p: VoidDialogProps) {
  const [reason, setReason] = useState('');
  const [value, setValue] = useState(p.kind === 'pass-fail' ? String(1 - (p.target.value ?? 0)) : '');
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const title =
    p.mode === 'correct'
      ? `Correct entry #${p.target.seq}`
      : p.mode === 'undo'
        ? 'Undo last entry'
        : `Void entry #${p.target.seq}`;
  async function submit() {
    const r = checkReason(reason);
    if (!r.ok) return setError(`${r.message} Nothing was saved.`);
    setBusy(true);
    try {
      if (p.mode === 'correct') {
        let v: number;
        if (p.kind === 'pass-fail') v = value === '1' ? 1 : 0;
        else {
          const parsed =
            p.kind === 'count' ? parseCount(value, 'New count') : parseMeasurement(value, 'New value');
          if (!parsed.ok) {
            setBusy(false);
            return setError(`${parsed.message} Nothing was saved.`);
          }
          v = parsed.value;
        }
        const entry: NewEntry = { value: v };
        if (p.target.note) entry.note = p.target.note;
        if (p.target.position) entry.position = p.target.position;
        await p.onCorrect(r.text, entry);
      } else await p.onVoid(r.text);
    } catch (err) {
      setError((err as Error).message);
      setBusy(false);
    }
  }
  return (
    <Modal title={title} onClose={p.onCancel}>
      <form
        class="stack"
        onSubmit={(e) => {
          e.preventDefault();
          void submit();
        }}
      >
        <p>
          Entry #{p.target.seq}: <strong>{p.describe(p.target)}</strong>. It stays in the log, struck through,
          and no longer counts.
        </p>
        {p.mode === 'correct' && p.kind !== 'pass-fail' && (
          <label class="field">
            <span>{p.kind === 'count' ? 'Correct count' : 'Correct value'}</span>
            <input
              inputMode={p.kind === 'count' ? 'numeric' : 'decimal'}
              autoComplete="off"
              value={value}
              onInput={(e) => setValue((e.currentTarget as HTMLInputElement).value)}
            />
          </label>
        )}
        {p.mode === 'correct' && p.kind === 'pass-fail' && (
          <fieldset class="choices">
            <legend>Correct result</legend>
            {[1, 0].map((v) => (
              <label key={v} class="choice">
                <input
                  type="radio"
                  name="pf"
                  checked={value === String(v)}
                  onChange={() => setValue(String(v))}
                />
                {v ? p.outcome : (p.other ?? `no ${p.outcome}`)}
              </label>
            ))}
          </fieldset>
        )}
        <fieldset class="choices">
          <legend>Reason</legend>
          <div class="chips">
            {REASONS.map((r) => (
              <button
                type="button"
                key={r}
                class={`chip ${reason === r ? 'on' : ''}`}
                onClick={() => setReason(r)}
              >
                {r}
              </button>
            ))}
          </div>
          <label class="field">
            <span>Reason in your words</span>
            <input
              value={reason}
              autoComplete="off"
              onInput={(e) => setReason((e.currentTarget as HTMLInputElement).value)}
            />
          </label>
        </fieldset>
        {error && (
          <p class="pad-msg error" role="alert">
            {error}
          </p>
        )}
        <div class="actions">
          <button type="button" class="btn" onClick={p.onCancel}>
            Cancel
          </button>
          <button type="submit" class="btn primary" disabled={busy}>
            {p.mode === 'correct' ? 'Save correction' : 'Void it'}
          </button>
        </div>
      </form>
    </Modal>
  );
}
