/**
 * "Import a study" on the Studies screen: pick a study bundle (.json) exported by another phone or built
 * by `sure-enough bundle`; it is checked first, pooled by the rule `sure-enough merge` uses, and written in
 * one transaction, or not at all (import.ts).
 */
import { useState } from 'preact/hooks';
import { href } from '../app/router.ts';
import type { ImportOutcome } from './import.ts';

export function ImportPanel() {
  const [busy, setBusy] = useState(false);
  const [outcome, setOutcome] = useState<ImportOutcome | null>(null);
  const [error, setError] = useState<string | null>(null);

  async function onFile(e: Event) {
    const input = e.currentTarget as HTMLInputElement;
    const file = input.files?.[0];
    if (!file) return;
    setBusy(true);
    setOutcome(null);
    setError(null);
    try {
      // validation and import code load on first use (not needed to record entries)
      const { importBundleText } = await import('./files.ts');
      setOutcome(await importBundleText(await file.text()));
    } catch (err) {
      setError(`Nothing was imported: ${(err as Error).message}`);
    } finally {
      setBusy(false);
      input.value = '';
    }
  }

  return (
    <section class="import" aria-labelledby="import-h" data-testid="import-panel">
      <h2 id="import-h">Import a study</h2>
      <p class="sub">
        A study bundle from another phone (pooling) or from <code>sure-enough bundle</code>. Entries already
        here are not added twice.
      </p>
      <label class="btn">
        Choose a bundle file
        <input
          type="file"
          accept=".json,application/json"
          disabled={busy}
          onChange={(e) => void onFile(e)}
          data-testid="import-file"
          class="sr-only"
        />
      </label>
      {error && (
        <p role="alert" class="error">
          {error}
        </p>
      )}
      {outcome && !outcome.ok && (
        <div role="alert" class="error" data-testid="import-problems">
          <p>Nothing was imported. The file has these problems:</p>
          <ul>
            {outcome.problems.map((p) => (
              <li key={p}>{p}</li>
            ))}
          </ul>
        </div>
      )}
      {outcome?.ok && (
        <div role="status" data-testid="import-done">
          <p>
            {outcome.created ? 'New study' : 'Pooled into'} “{outcome.studyName}”: {outcome.added} added
            {outcome.alreadyPresent > 0 ? `, ${outcome.alreadyPresent} already here` : ''}.{' '}
            <a href={href.report(outcome.studyId)}>Open its report</a>
          </p>
          {outcome.studyDiffers.length > 0 && (
            <p>
              The file's study record differs in {outcome.studyDiffers.join(', ')}; this phone keeps its own.
            </p>
          )}
          {outcome.duplicates.length > 0 && (
            <p>
              Likely duplicates (both kept):{' '}
              {outcome.duplicates.map((d) => `${d.label} (${d.devices.join(', ')})`).join('; ')}
            </p>
          )}
        </div>
      )}
    </section>
  );
}
