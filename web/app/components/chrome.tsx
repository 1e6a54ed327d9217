/** Screen chrome: the top bar, the demo label, the backup line. */
import type { ComponentChildren } from 'preact';
import { settings, updateSettings } from '../../state/app-state.ts';
import { useStore } from '../../state/store.ts';

export function TopBar(props: {
  title: string;
  back?: { href: string; label: string };
  children?: ComponentChildren;
}) {
  const s = useStore(settings);
  return (
    <header class="topbar">
      {props.back && (
        <a class="back" href={props.back.href}>
          <span aria-hidden="true">‹ </span>
          {props.back.label}
        </a>
      )}
      <h1>{props.title}</h1>
      {props.children}
      <button
        type="button"
        class="sun-toggle"
        aria-pressed={s.sun}
        onClick={() => updateSettings({ sun: !s.sun })}
        title="High-contrast sun theme"
      >
        Sun
      </button>
    </header>
  );
}

export function DemoLabel() {
  return (
    <p class="demo-label" role="note">
      Invented demo data, not a real site
    </p>
  );
}

export function BackupLine(props: { notExported: number }) {
  return (
    <p class={`backup ${props.notExported > 0 ? 'pending' : ''}`} data-testid="backup">
      {props.notExported === 0
        ? 'All entries exported'
        : `${props.notExported} ${props.notExported === 1 ? 'entry' : 'entries'} not yet exported`}
    </p>
  );
}

export function StudyTabs(props: { id: string; current: 'field' | 'log' | 'report' }) {
  const tabs: [typeof props.current, string, string][] = [
    ['field', 'Field', `#/s/${props.id}`],
    ['log', 'Log', `#/s/${props.id}/log`],
    ['report', 'Report', `#/s/${props.id}/report`],
  ];
  return (
    <nav class="tabs" aria-label="Study screens">
      {tabs.map(([k, label, href]) => (
        <a key={k} href={href} aria-current={k === props.current ? 'page' : undefined}>
          {label}
        </a>
      ))}
    </nav>
  );
}
