/**
 * The field screen's design piece, ready to mount: `useDesignEntry` keeps the stratum (and primary unit)
 * the next entries are filed under — the "where next" suggestion until the crew picks one — and tags each
 * new entry with them; `DesignBar` shows the strata panel for studies that declare strata, and otherwise
 * a folded "primary unit" field (transects of quadrats, rooms) whose label is filed with each entry. Mounting needs two lines in the field screen: tag the entry in `save`, render the bar.
 */
import { useState } from 'preact/hooks';
import { StrataPanel } from './strata-panel.tsx';
import type { Assessment, ObservationRecord, Point, StoredStudyLike } from './types.ts';

export interface DesignEntry {
  /** True when the study declares strata. */
  active: boolean;
  stratum: string | null;
  unit: string;
  pick(name: string): void;
  setUnit(label: string): void;
  /** The entry with the chosen stratum / primary unit added (unchanged when the study has no strata). */
  tag<E extends { stratum?: string; cluster?: string }>(entry: E): E;
}

export function useDesignEntry(study: StoredStudyLike, assessment: Assessment): DesignEntry {
  const [picked, setPicked] = useState<string | null>(null);
  const [unit, setUnit] = useState('');
  const strata = study.setup.strata ?? [];
  const active = strata.length > 0;
  const suggested = typeof assessment.details.whereNext === 'string' ? assessment.details.whereNext : null;
  const stratum = active ? (picked ?? suggested ?? strata[0]?.name ?? null) : null;
  return {
    active,
    stratum,
    unit,
    pick: setPicked,
    setUnit,
    tag(entry) {
      const out = { ...entry };
      if (stratum !== null) out.stratum = stratum;
      if (unit.trim() !== '') out.cluster = unit.trim();
      return out;
    },
  };
}

/** Counted entries (not voided) as the core's points. */
export function countedPoints(
  records: readonly ObservationRecord[],
  isVoided: (id: string) => boolean,
): Point[] {
  const out: Point[] = [];
  for (const r of records) {
    if (r.voids !== undefined || r.value === undefined || isVoided(r.id)) continue;
    const p: Point = { value: r.value };
    if (r.censored) p.censored = true;
    if (r.stratum !== undefined) p.stratum = r.stratum;
    if (r.cluster !== undefined) p.cluster = r.cluster;
    out.push(p);
  }
  return out;
}

export function DesignBar(props: {
  design: DesignEntry;
  study: StoredStudyLike;
  assessment: Assessment;
  records: readonly ObservationRecord[];
  isVoided: (id: string) => boolean;
}) {
  const { design } = props;
  if (!design.active)
    return (
      <details class="unit-details" data-testid="unit-details" open={design.unit !== ''}>
        <summary>Primary unit (transect, room): {design.unit.trim() || 'none'}</summary>
        <label>
          Entries saved from now on belong to{' '}
          <input
            type="text"
            value={design.unit}
            placeholder="e.g. T3"
            onInput={(e) => design.setUnit((e.currentTarget as HTMLInputElement).value)}
          />
        </label>
        <p class="help">
          With primary units the interval uses the units, not the entries, as replicates, and shows the design
          effect.
        </p>
      </details>
    );
  return (
    <StrataPanel
      setup={props.study.setup}
      points={countedPoints(props.records, props.isVoided)}
      assessment={props.assessment}
      current={design.stratum}
      onPick={design.pick}
      unit={design.unit}
      onUnit={design.setUnit}
    />
  );
}
