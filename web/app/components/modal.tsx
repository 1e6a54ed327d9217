/** A modal dialog: labelled, focus moves into it, Escape closes, focus returns to the opener. */
import type { ComponentChildren } from 'preact';
import { useEffect, useRef } from 'preact/hooks';

export function Modal(props: { title: string; onClose(): void; children: ComponentChildren }) {
  const ref = useRef<HTMLDivElement>(null);
  useEffect(() => {
    const opener = document.activeElement as HTMLElement | null;
    const first = ref.current?.querySelector<HTMLElement>('input, textarea, select, button');
    first?.focus();
    const onKey = (e: KeyboardEvent) => {
      if (e.key === 'Escape') props.onClose();
    };
    document.addEventListener('keydown', onKey);
    return () => {
      document.removeEventListener('keydown', onKey);
      // without scrolling: the opener may sit in the field screen's scrolling pane, and scrolling it into
      // view there would push the verdict out of sight
      opener?.focus?.({ preventScroll: true });
    };
  }, []);
  return (
    <div class="backdrop">
      <div class="modal" role="dialog" aria-modal="true" aria-labelledby="modal-title" ref={ref}>
        <h2 id="modal-title">{props.title}</h2>
        {props.children}
      </div>
    </div>
  );
}
