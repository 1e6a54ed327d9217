/**
 * The report file's HTML pieces: escaping, table rows, the print style and the inline SVG chart of the
 * running interval. The words inside them come from src/words; the page itself is put together in
 * report.ts.
 *
 * Everything typed by a user is HTML-escaped (`escapeHtml`): the five characters & < > " ' become character
 * references (HTML Living Standard, §13.1.4 "character references"), so no typed text can open an element or
 * an attribute.
 */
import type { StudySetup } from '../model/records.ts';
import { figureScale, plain, readable } from '../words/index.ts';

export function escapeHtml(text: string): string {
  return text
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&#39;');
}

export const esc = (v: unknown): string => escapeHtml(v === undefined || v === null ? '' : String(v));

/** A table row: the label is escaped here, the value must already be HTML. */
export function row(label: string, value: string): string {
  return `<tr><th scope="row">${esc(label)}</th><td>${value}</td></tr>`;
}

/** The page's own style (screen and print; A4 pages). */
export const REPORT_CSS = `
  body { font: 11pt/1.45 system-ui, -apple-system, "Segoe UI", Roboto, sans-serif; color: #111; max-width: 46rem; margin: 1.5rem auto; padding: 0 1rem; }
  h1 { font-size: 1.5rem; margin: 0 0 .25rem; } h2 { font-size: 1.1rem; margin: 1.4rem 0 .4rem; border-bottom: 1px solid #ccc; }
  table { border-collapse: collapse; width: 100%; } th, td { text-align: left; padding: .2rem .5rem .2rem 0; vertical-align: top; }
  th[scope=row] { font-weight: 600; width: 38%; } thead th { border-bottom: 1px solid #999; }
  .verdict { font-size: 1.35rem; font-weight: 700; padding: .5rem .75rem; border: 2px solid #17324d; display: inline-block; }
  .muted { color: #555; } code, .hash { font-family: ui-monospace, Menlo, Consolas, monospace; font-size: .85em; word-break: break-all; }
  ul { padding-left: 1.2rem; }
  @page { size: A4; margin: 15mm; }
  @media print { body { margin: 0; max-width: none; font-size: 10pt; } h2 { break-after: avoid; } table, svg, .keep { break-inside: avoid; } a { color: inherit; text-decoration: none; } }
`;

export interface ChartPoint {
  n: number;
  estimate: number | null;
  lower: number | null;
  upper: number | null;
}

/**
 * The running estimate (line) and its interval (band) against n, with the limit line when the target is a
 * limit; pass/fail labels in percent of items, as everywhere else.
 */
export function chartSvg(points: ChartPoint[], setup: StudySetup): string {
  const W = 640;
  const H = 260;
  const L = 56;
  const R = 12;
  const T = 12;
  const B = 36;
  const k = figureScale(setup);
  // a one-sided bound is drawn as a band from the estimate to the bound
  const finite = points
    .filter((p) => p.estimate !== null && (p.lower !== null || p.upper !== null))
    .map((p) => ({
      n: p.n,
      estimate: p.estimate as number,
      lower: p.lower ?? (p.estimate as number),
      upper: p.upper ?? (p.estimate as number),
    }));
  if (finite.length === 0)
    return '<p class="muted">No interval yet: too few counted entries to draw the running interval.</p>';
  let lo = Math.min(...finite.map((p) => p.lower));
  let hi = Math.max(...finite.map((p) => p.upper));
  const limit = setup.target?.kind === 'limit' ? setup.target.value : null;
  if (limit !== null) {
    lo = Math.min(lo, limit);
    hi = Math.max(hi, limit);
  }
  if (hi === lo) {
    hi += 1;
    lo -= 1;
  }
  const pad = (hi - lo) * 0.05;
  lo -= pad;
  hi += pad;
  const nMax = Math.max(...points.map((p) => p.n), 2);
  const x = (n: number) => L + ((n - 1) / (nMax - 1)) * (W - L - R);
  const y = (v: number) => T + ((hi - v) / (hi - lo)) * (H - T - B);
  const f = (v: number) => v.toFixed(1);
  const band = `${finite.map((p) => `${f(x(p.n))},${f(y(p.upper))}`).join(' ')} ${[...finite]
    .reverse()
    .map((p) => `${f(x(p.n))},${f(y(p.lower))}`)
    .join(' ')}`;
  const line = finite.map((p) => `${f(x(p.n))},${f(y(p.estimate))}`).join(' ');
  const ticks = [lo + pad, (lo + hi) / 2, hi - pad];
  const parts = [
    `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 ${W} ${H}" width="100%" role="img" aria-label="Running estimate and interval against the number of entries">`,
    `<rect x="${L}" y="${T}" width="${W - L - R}" height="${H - T - B}" fill="none" stroke="#999"/>`,
    `<polygon points="${band}" fill="#9ec3e6" fill-opacity="0.6" stroke="none"/>`,
    `<polyline points="${line}" fill="none" stroke="#17324d" stroke-width="2"/>`,
  ];
  if (limit !== null)
    parts.push(
      `<line x1="${L}" x2="${W - R}" y1="${f(y(limit))}" y2="${f(y(limit))}" stroke="#b00020" stroke-dasharray="6 4"/>`,
      `<text x="${W - R - 4}" y="${f(y(limit) - 4)}" text-anchor="end" font-size="11" fill="#b00020">limit ${esc(plain(limit * k))}${k === 100 ? ' %' : ''}</text>`,
    );
  for (const t of ticks)
    parts.push(
      `<text x="${L - 6}" y="${f(y(t) + 4)}" text-anchor="end" font-size="11">${esc(readable(t * k))}</text>`,
    );
  parts.push(
    `<text x="${L}" y="${H - 18}" font-size="11">1</text>`,
    `<text x="${W - R}" y="${H - 18}" text-anchor="end" font-size="11">${nMax}</text>`,
    `<text x="${(L + W - R) / 2}" y="${H - 4}" text-anchor="middle" font-size="12">counted entries (n)</text>`,
    '</svg>',
  );
  return parts.join('\n');
}
