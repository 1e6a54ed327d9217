/** "Open the demo": one invented scenario per data kind (web/app/demo.ts), labelled as invented. */
import { useState } from 'preact/hooks';
import { device } from '../../state/app-state.ts';
import { appendDemoEntries } from '../../storage/observations.ts';
import { createStudy, listStudies } from '../../storage/studies.ts';
import { TopBar } from '../components/chrome.tsx';
import { type DemoScenario, demoScenarios } from '../demo.ts';
import { go, href } from '../router.ts';

export async function openDemo(d: DemoScenario): Promise<void> {
  const existing = (await listStudies()).find(
    (s) => s.demo && !s.archivedAt && s.setup.kind === d.setup.kind,
  );
  if (existing) return go(href.field(existing.id));
  const study = await createStudy({ name: d.name, setup: d.setup, demo: true }, device.get());
  await appendDemoEntries(study.id, d.values, d.gapMs, device.get());
  go(href.field(study.id));
}

export function DemoScreen() {
  const [error, setError] = useState<string | null>(null);
  return (
    <div class="screen demo-screen">
      <TopBar title="Open the demo" back={{ href: href.studies(), label: 'Studies' }} />
      <p class="demo-label" role="note">
        Every demo uses invented data for an invented place. Try the screens, then archive the demo.
      </p>
      {error && (
        <p class="warn" role="alert">
          {error}
        </p>
      )}
      <ul class="cards">
        {demoScenarios().map((d) => (
          <li key={d.key} class="card">
            <button
              type="button"
              class="card-main"
              onClick={() => openDemo(d).catch((err) => setError((err as Error).message))}
            >
              <span class="card-name">{d.name}</span>
              <span class="card-kind">{d.blurb}</span>
            </button>
          </li>
        ))}
      </ul>
    </div>
  );
}
