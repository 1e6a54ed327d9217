/**
 * The running estimate and its interval against n, the target (band or limit line) and where the
 * projection meets it, with the unit on the value axis, "entries" on the other and a legend that names
 * every mark (the legend's swatches are drawn with the chart's own classes, so they match in the sun
 * theme too). Plain SVG; the series is already downsampled (≤ 160 points), so drawing is bounded work
 * whatever the number of entries.
 */
import type { Assessment, Target } from '../../core.ts';
import { decimalsFor, fixed } from '../../core-light.ts';
import type { SeriesPoint } from '../../state/session.ts';

const W = 360;
const H = 150;
const PAD = { l: 44, r: 10, t: 18, b: 24 };

export interface ChartProps {
  series: readonly SeriesPoint[];
  current: Assessment;
  target: Target | undefined;
  /** Multiplier for labels (100 for pass/fail percentages). */
  scale: number;
  label: string;
  /** Unit of the figures as shown ("mg/L", "% loose fitting", "per plot"). */
  unit?: string;
  sep?: string;
}

/** Tick label with enough decimals to tell ticks `step` apart (the words module's rounding rule). */
function nice(x: number, step: number, sep = '.'): string {
  return fixed(x, decimalsFor(step), sep);
}

/** One legend entry: a small swatch drawn with the chart's class for that mark, and its name. */
function Key(props: { cls: string; shape: 'line' | 'area'; children: string }) {
  return (
    <li>
      <svg class="swatch" viewBox="0 0 24 12" aria-hidden="true">
        {props.shape === 'area' ? (
          <rect class={props.cls} x="0" y="1" width="24" height="10" />
        ) : (
          <line class={props.cls} x1="0" x2="24" y1="6" y2="6" />
        )}
      </svg>
      {props.children}
    </li>
  );
}

/** A chart point with both sides bounded (a two-sided interval). */
type BandPoint = SeriesPoint & { lower: number; upper: number };
export function Chart({ series, current, target, scale, label, unit = '', sep = '.' }: ChartProps) {
  // a one-sided bound (the other side null) is not drawn as a band here
  const pts = series.filter((p): p is BandPoint => p.lower !== null && p.upper !== null);
  const last = pts.at(-1);
  if (!last || pts.length < 2) {
    return (
      <figure class="chart empty">
        <p class="empty-note">The chart starts after a few entries.</p>
      </figure>
    );
  }
  const n = current.n;
  const more = current.verdict.status === 'keep going' && current.more ? current.more.likely : 0;
  const meetN = more > 0 ? n + more : null;
  const xMax = Math.max(meetN ?? n, n, 2);
  const est = current.estimate ?? last.estimate;
  let band: [number, number] | null = null;
  let limit: number | null = null;
  if (target?.kind === 'margin') band = [est - target.value, est + target.value];
  else if (target?.kind === 'relative') band = [est * (1 - target.value), est * (1 + target.value)];
  else if (target?.kind === 'limit') limit = target.value;
  // The y range follows the later half of the series so the early, very wide intervals do not flatten it.
  const recent = pts.slice(Math.floor(pts.length / 3));
  let lo = Math.min(...recent.map((p) => p.lower));
  let hi = Math.max(...recent.map((p) => p.upper));
  for (const v of [...(band ?? []), ...(limit !== null ? [limit] : [])]) {
    lo = Math.min(lo, v);
    hi = Math.max(hi, v);
  }
  if (hi - lo < 1e-12) {
    hi += 1;
    lo -= 1;
  }
  const span = hi - lo;
  lo -= span * 0.08;
  hi += span * 0.08;
  const x = (v: number) => PAD.l + ((v - 1) / (xMax - 1)) * (W - PAD.l - PAD.r);
  const y = (v: number) =>
    PAD.t + (1 - (Math.min(hi, Math.max(lo, v)) - lo) / (hi - lo)) * (H - PAD.t - PAD.b);
  const line = (f: (p: BandPoint) => number) =>
    pts.map((p, i) => `${i ? 'L' : 'M'}${x(p.n).toFixed(1)},${y(f(p)).toFixed(1)}`).join('');
  const area = `${line((p) => p.upper)}${[...pts]
    .reverse()
    .map((p) => `L${x(p.n).toFixed(1)},${y(p.lower).toFixed(1)}`)
    .join('')}Z`;
  const ticks = [lo + (hi - lo) * 0.1, (lo + hi) / 2, hi - (hi - lo) * 0.1];
  const desc =
    `${label}. Running estimate and interval for n = ${pts[0]?.n} to ${last.n}` +
    (limit !== null
      ? `, limit line at ${nice(limit * scale, (hi - lo) * scale, sep)} ${unit}`
      : band
        ? ', target band around the estimate'
        : '') +
    (meetN ? `; projection meets the target near n = ${meetN}.` : '.');
  return (
    <figure class="chart">
      <svg viewBox={`0 0 ${W} ${H}`} role="img" aria-label={desc}>
        <rect class="plot-bg" x={PAD.l} y={PAD.t} width={W - PAD.l - PAD.r} height={H - PAD.t - PAD.b} />
        {band && (
          <rect
            class="target-band"
            x={PAD.l}
            width={W - PAD.l - PAD.r}
            y={y(band[1])}
            height={Math.max(1, y(band[0]) - y(band[1]))}
          />
        )}
        {limit !== null && <line class="limit" x1={PAD.l} x2={W - PAD.r} y1={y(limit)} y2={y(limit)} />}
        <path class="c-ci" d={area} />
        <path class="c-est" d={line((p) => p.estimate)} />
        {meetN && current.lower !== null && current.upper !== null && (
          <g class="proj">
            <line
              x1={x(n)}
              y1={y(current.upper)}
              x2={x(meetN)}
              y2={y(band ? band[1] : (current.upper + est) / 2)}
            />
            <line
              x1={x(n)}
              y1={y(current.lower)}
              x2={x(meetN)}
              y2={y(band ? band[0] : (current.lower + est) / 2)}
            />
            <line class="meet" x1={x(meetN)} x2={x(meetN)} y1={PAD.t} y2={H - PAD.b} />
            <text x={x(meetN) - 3} y={PAD.t + 10} text-anchor="end">
              ≈ n {meetN}
            </text>
          </g>
        )}
        {ticks.map((t) => (
          <text key={t} class="tick" x={PAD.l - 4} y={y(t) + 4} text-anchor="end">
            {nice(t * scale, ((hi - lo) / 2.5) * scale, sep)}
          </text>
        ))}
        <text class="tick" x={PAD.l} y={H - 6}>
          1
        </text>
        <text class="axis-name" x={(PAD.l + W - PAD.r) / 2} y={H - 6} text-anchor="middle">
          entries (n)
        </text>
        <text class="tick" x={W - PAD.r} y={H - 6} text-anchor="end">
          {xMax}
        </text>
        {unit && (
          <text class="axis-name" x={4} y={11} data-testid="chart-unit">
            {unit}
          </text>
        )}
      </svg>
      <figcaption>
        <ul class="legend" data-testid="chart-legend">
          <Key cls="c-est" shape="line">
            estimate
          </Key>
          <Key cls="c-ci" shape="area">
            interval
          </Key>
          {band && (
            <Key cls="target-band" shape="area">
              target: ± around the estimate
            </Key>
          )}
          {limit !== null && (
            <Key cls="limit" shape="line">
              {`limit ${nice(limit * scale, (hi - lo) * scale, sep)} ${unit}`.trim()}
            </Key>
          )}
          {meetN !== null && (
            <Key cls="proj-line" shape="line">
              {`projection: target near n ${meetN}`}
            </Key>
          )}
        </ul>
      </figcaption>
    </figure>
  );
}
