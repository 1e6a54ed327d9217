/** Loading / missing / error states shared by the study screens. */
import type { VNode } from 'preact';
import type { StudyView } from '../../state/use-study.ts';
import { TopBar } from '../components/chrome.tsx';
import { href } from '../router.ts';

export function StudyGate(props: { view: StudyView; screen: string; children: () => VNode }) {
  const { view } = props;
  if (view.loadError || view.missing || !view.session) {
    return (
      <div class={`screen ${props.screen}-screen`}>
        <TopBar title="Sure Enough" back={{ href: href.studies(), label: 'Studies' }} />
        <p class={view.loadError ? 'warn' : 'loading'} role={view.loadError ? 'alert' : 'status'}>
          {view.loadError ?? (view.missing ? 'This study is not on this phone.' : 'Loading the study…')}
        </p>
      </div>
    );
  }
  return props.children();
}
