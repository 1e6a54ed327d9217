/**
 * "Join a crew" on the studies screen: type or paste the crew code shown on the phone that shared the
 * study (or scan its QR code: the link opens this screen with the code filled in, `#/?join=<code>`). The
 * study is created on this phone from the crew server's answer and opens on its field screen.
 */
import { useEffect, useRef, useState } from 'preact/hooks';
import { normalizeCrewCode } from '../../core-light.ts';
import { go, href } from '../router.ts';

/** The code a scanned join link carries, if any. */
export function codeFromHash(hash: string): string | null {
  const query = hash.split('?')[1];
  return query === undefined ? null : new URLSearchParams(query).get('join');
}

export function CrewJoin() {
  const scanned = codeFromHash(window.location.hash);
  const [open, setOpen] = useState(scanned !== null);
  const [code, setCode] = useState(scanned ?? '');
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const field = useRef<HTMLInputElement>(null);
  useEffect(() => {
    if (open) field.current?.focus();
  }, [open]);

  const join = async (e: Event) => {
    e.preventDefault();
    setError(null);
    if (normalizeCrewCode(code) === null) {
      setError(
        'That is not a crew code: a crew code has 16 letters and digits, shown as four groups of four (like 7K2M-Q9XD-4HVA-P3WE).',
      );
      return;
    }
    setBusy(true);
    try {
      const { joinCrew } = await import('../../sync/crew-actions.ts');
      const r = await joinCrew(code);
      if (r.ok) go(href.field(r.value.studyId));
      else setError(r.message);
    } catch (err) {
      setError(`Not joined: ${(err as Error).message}`);
    } finally {
      setBusy(false);
    }
  };

  return (
    <section class="crew-join" aria-labelledby="crew-join-h">
      <h2 id="crew-join-h">Crew</h2>
      {!open ? (
        <button type="button" class="btn big" onClick={() => setOpen(true)}>
          Join a crew
        </button>
      ) : (
        <form onSubmit={join}>
          <label for="crew-code-input">Crew code</label>
          <input
            id="crew-code-input"
            ref={field}
            value={code}
            autocomplete="off"
            autocapitalize="characters"
            spellcheck={false}
            inputMode="text"
            placeholder="7K2M-Q9XD-4HVA-P3WE"
            onInput={(e) => setCode((e.currentTarget as HTMLInputElement).value)}
          />
          <button type="submit" class="btn primary big" disabled={busy}>
            {busy ? 'Joining…' : 'Join'}
          </button>
          {error && (
            <p role="alert" class="error" data-testid="crew-join-error">
              {error}
            </p>
          )}
        </form>
      )}
    </section>
  );
}
