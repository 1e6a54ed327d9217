/**
 * The New study form's text fields → a study setup. This file reads what was typed (numbers with a
 * decimal comma or point, percentages for pass/fail rates and relative targets, strata as `name:weight`
 * lists) and says so when it cannot be read; whether the setup is valid is decided by the one setup
 * validator of the core (src/model/setup.ts), the same that checks the command line's flags and an
 * imported bundle. Its problems are shown under the field that sets the value, in the same words.
 *
 * The form asks for more than a valid setup, because a crew starting a study writes down what a
 * reader of its data needs: a study name, the unit of measurements, the counted outcome of pass/fail
 * items, the source and date of a limit, and the cautions ticked. Those are this form's own checks.
 */
import type { DataKind, RuleName, StudySetup, Target } from '../../core.ts';
import { formatStrata, parseStrata, SETUP_DEFAULTS, setupProblems } from '../../core-light.ts';
import { parseMeasurement } from '../../input/parse.ts';
import type { StoredStudy } from '../../storage/schema.ts';

export type TargetKind = Target['kind'];
export interface Form {
  name: string;
  kind: DataKind;
  unit: string;
  reportingLimit: string;
  plotArea: string;
  plotAreaUnit: string;
  outcome: string;
  targetKind: TargetKind;
  targetValue: string;
  limitSource: string;
  limitDate: string;
  level: string;
  customLevel: string;
  rule: RuleName;
  sprtAlpha: string;
  sprtBeta: string;
  sprtLow: string;
  sprtHigh: string;
  population: string;
  min: string;
  /** The hot-spot share in percent (stored as a fraction, hotSpotShare). */
  hotSpot: string;
  max: string;
  nbK: string;
  taylorA: string;
  taylorB: string;
  /** Strata as name:weight pairs and efforts per entry (the command line's --strata / --cost syntax). */
  strata: string;
  strataCosts: string;
  /** Planning CV for the limit decision's figures on measurements (setup screen only, not stored). */
  planningCv: string;
  /** Interval method of measurements: '' leaves the choice to the data (the core's default, auto). */
  method: '' | 't' | 'gamma' | 'cox';
  iwaoAlpha: string;
  iwaoBeta: string;
  taxon: string;
  samplingProtocol: string;
  otherOutcome: string;
  /** '' follows the phone's locale when the study is started. */
  sep: '' | '.' | ',';
  rangeLow: string;
  rangeHigh: string;
  positionWarnM: string;
  ack: boolean;
}

export type Errors = Partial<Record<keyof Form, string>>;

export const EMPTY: Form = {
  name: '',
  kind: 'measurement',
  unit: '',
  reportingLimit: '',
  plotArea: '1',
  plotAreaUnit: 'm2',
  outcome: '',
  targetKind: 'margin',
  targetValue: '',
  limitSource: '',
  limitDate: '',
  level: String(SETUP_DEFAULTS.level),
  customLevel: '',
  rule: SETUP_DEFAULTS.rule,
  sprtAlpha: String(SETUP_DEFAULTS.sprtAlpha),
  sprtBeta: String(SETUP_DEFAULTS.sprtBeta),
  sprtLow: '',
  sprtHigh: '',
  population: '',
  min: String(SETUP_DEFAULTS.min),
  hotSpot: String(SETUP_DEFAULTS.hotSpotShare * 100),
  max: '',
  nbK: '',
  taylorA: '',
  taylorB: '',
  strata: '',
  strataCosts: '',
  planningCv: '1',
  method: '',
  iwaoAlpha: '',
  iwaoBeta: '',
  taxon: '',
  samplingProtocol: '',
  otherOutcome: '',
  sep: '',
  rangeLow: '',
  rangeHigh: '',
  positionWarnM: '30',
  ack: false,
};

/** Pass/fail margins and limits are typed in percent. */
export const pctKinds = (f: Form) =>
  f.kind === 'pass-fail' && (f.targetKind === 'margin' || f.targetKind === 'limit');
const str = (x: number | undefined, k = 1) =>
  x === undefined ? '' : String(Number((x * k).toPrecision(12)));
const LEVELS = ['0.8', '0.9', '0.95', '0.99'];

/** The form filled from a saved study (duplicate for the next site, or change = a new version). */
export function fromStudy(s: StoredStudy, mode: 'duplicate' | 'change'): Form {
  const st = s.setup;
  const t = st.target;
  const pct = st.kind === 'pass-fail' && (t?.kind === 'margin' || t?.kind === 'limit') ? 100 : 1;
  const relK = t?.kind === 'relative' ? 100 : pct;
  const lv = String(st.level);
  return {
    ...EMPTY,
    name: mode === 'change' ? s.name : `${s.name} (copy)`,
    kind: st.kind,
    unit: st.unit && st.kind === 'measurement' ? st.unit : '',
    reportingLimit: str(st.reportingLimit),
    plotArea: str(st.plotArea) || '1',
    plotAreaUnit: st.plotAreaUnit ?? 'm2',
    outcome: st.outcomeName ?? '',
    targetKind: t?.kind ?? 'margin',
    targetValue: str(t?.value, relK),
    limitSource: t?.kind === 'limit' ? (t.source ?? '') : '',
    limitDate: t?.kind === 'limit' ? (t.date ?? '') : '',
    level: LEVELS.includes(lv) ? lv : 'custom',
    customLevel: LEVELS.includes(lv) ? '' : str(st.level, 100),
    rule: st.rule,
    sprtAlpha: str(st.sprt?.alpha) || EMPTY.sprtAlpha,
    sprtBeta: str(st.sprt?.beta) || EMPTY.sprtBeta,
    sprtLow: str(st.sprt?.lowerBound, pct),
    sprtHigh: str(st.sprt?.upperBound, pct),
    population: str(st.population),
    min: String(st.min),
    hotSpot: str(st.hotSpotShare, 100) || EMPTY.hotSpot,
    max: str(st.max),
    nbK: str(st.planning?.negBinomialK),
    taylorA: str(st.planning?.taylorA),
    taylorB: str(st.planning?.taylorB),
    strata: st.strata ? formatStrata(st.strata).strata : '',
    strataCosts: st.strata ? (formatStrata(st.strata).costs ?? '') : '',
    method: st.method === 't' || st.method === 'gamma' || st.method === 'cox' ? st.method : '',
    iwaoAlpha: str(st.planning?.iwaoAlpha),
    iwaoBeta: str(st.planning?.iwaoBeta),
    taxon: st.taxon ?? '',
    samplingProtocol: st.samplingProtocol ?? '',
    otherOutcome: st.otherOutcomeName ?? '',
    sep: st.decimalSeparator ?? '',
    rangeLow: str(st.expectedRange?.low),
    rangeHigh: str(st.expectedRange?.high),
    positionWarnM: str(st.positionWarnM) || EMPTY.positionWarnM,
  };
}

/** The label a field's messages start with. */
const LABEL: Record<keyof Form, string> = {
  name: 'Name',
  kind: 'Data kind',
  unit: 'Unit',
  reportingLimit: 'Reporting limit',
  plotArea: 'Plot area',
  plotAreaUnit: 'Plot area unit',
  outcome: 'Counted outcome',
  targetKind: 'Target',
  targetValue: 'Target value',
  limitSource: 'Limit source',
  limitDate: 'Limit date',
  level: 'Confidence level',
  customLevel: 'Confidence level',
  rule: 'Stopping rule',
  sprtAlpha: 'SPRT α',
  sprtBeta: 'SPRT β',
  sprtLow: 'Lower edge of the indifference zone',
  sprtHigh: 'Upper edge of the indifference zone',
  population: 'Lot or population size',
  min: 'Minimum before any verdict',
  hotSpot: 'Smallest area that must not go unseen',
  max: 'Planned maximum',
  nbK: 'Negative binomial k',
  taylorA: 'Taylor a',
  taylorB: 'Taylor b',
  strata: 'Strata',
  strataCosts: 'Effort per stratum',
  planningCv: 'Expected spread',
  method: 'Method',
  iwaoAlpha: 'Iwao α',
  iwaoBeta: 'Iwao β',
  taxon: 'Scientific name',
  samplingProtocol: 'How it was counted',
  otherOutcome: 'The other result',
  sep: 'Decimal separator',
  rangeLow: 'Expected lowest value',
  rangeHigh: 'Expected highest value',
  positionWarnM: 'Warn when the position is worse than',
  ack: 'Cautions',
};

/** The setup fields each form field sets (a path not listed falls back to its first member's field). */
const FIELD_OF: Record<string, keyof Form> = {
  kind: 'kind',
  method: 'method',
  sided: 'level',
  target: 'targetKind',
  'target.kind': 'targetKind',
  'target.value': 'targetValue',
  'target.source': 'limitSource',
  'target.date': 'limitDate',
  rule: 'rule',
  min: 'min',
  hotSpotShare: 'hotSpot',
  population: 'population',
  plotArea: 'plotArea',
  max: 'max',
  planning: 'nbK',
  'planning.negBinomialK': 'nbK',
  'planning.taylorA': 'taylorA',
  'planning.taylorB': 'taylorB',
  'planning.iwaoAlpha': 'iwaoAlpha',
  'planning.iwaoBeta': 'iwaoBeta',
  samplingProtocol: 'samplingProtocol',
  otherOutcomeName: 'otherOutcome',
  decimalSeparator: 'sep',
  expectedRange: 'rangeLow',
  'expectedRange.low': 'rangeLow',
  'expectedRange.high': 'rangeHigh',
  positionWarnM: 'positionWarnM',
  sprt: 'sprtAlpha',
  'sprt.alpha': 'sprtAlpha',
  'sprt.beta': 'sprtBeta',
  'sprt.lowerBound': 'sprtLow',
  'sprt.upperBound': 'sprtHigh',
  'sprt.maxN': 'max',
  strata: 'strata',
  design: 'strata',
  nonDetects: 'kind',
  unit: 'unit',
  plotAreaUnit: 'plotAreaUnit',
  outcomeName: 'outcome',
  taxon: 'taxon',
  reportingLimit: 'reportingLimit',
};

/** The form field that shows a setup problem at `path`. */
export function fieldOf(path: string, f: Form): keyof Form {
  if (path === 'level') return f.level === 'custom' ? 'customLevel' : 'level';
  if (/^strata\[\d+\]\.cost$/.test(path)) return 'strataCosts';
  if (path.startsWith('strata')) return 'strata';
  return FIELD_OF[path] ?? FIELD_OF[path.split('.')[0]!] ?? 'name';
}

/** Only the members that were given (the validator reads a missing member as `missing`). */
function given<T extends object>(o: T): Partial<T> {
  return Object.fromEntries(Object.entries(o).filter(([, v]) => v !== undefined)) as Partial<T>;
}

/** Turns the form into a setup, or the list of what is wrong, field by field. */
export function buildSetup(f: Form): { setup: StudySetup; name: string } | { errors: Errors } {
  const e: Errors = {};
  /** The number typed in a field (undefined when empty or unreadable; the reason is in `e`). */
  const num = (key: keyof Form, optional = false): number | undefined => {
    const raw = String(f[key]);
    if (raw.trim() === '') {
      if (!optional) e[key] = `${LABEL[key]}: required.`;
      return undefined;
    }
    const p = parseMeasurement(raw, LABEL[key]);
    if (!p.ok) e[key] = p.message;
    return p.ok ? p.value : undefined;
  };
  const name = f.name.trim();
  if (!name) e.name = 'Name: required (e.g. the site and the date).';
  else if (name.length > 120) e.name = `Name: ${name.length} characters; at most 120.`;
  const pct = pctKinds(f) ? 100 : 1;
  const setup: Record<string, unknown> = { kind: f.kind, sided: 'two', rule: f.rule };
  if (f.kind === 'measurement') {
    if (f.unit.trim()) setup.unit = f.unit.trim();
    else e.unit = 'Unit: required (e.g. mg/kg, µg/L, cm).';
    setup.reportingLimit = num('reportingLimit', true);
  } else if (f.kind === 'count') {
    setup.unit = '1';
    setup.plotArea = num('plotArea');
    setup.plotAreaUnit = f.plotAreaUnit.trim() || 'm2';
    if (f.outcome.trim()) setup.outcomeName = f.outcome.trim();
    if (f.taxon.trim()) setup.taxon = f.taxon.trim();
    if (f.samplingProtocol.trim()) setup.samplingProtocol = f.samplingProtocol.trim();
  } else {
    if (f.outcome.trim()) setup.outcomeName = f.outcome.trim();
    else e.outcome = 'Counted outcome: required (e.g. defect, leak, missing label).';
    if (f.otherOutcome.trim()) setup.otherOutcomeName = f.otherOutcome.trim();
  }
  if (f.kind === 'measurement' && f.method) setup.method = f.method;
  if (f.kind !== 'pass-fail') {
    const range = given({ low: num('rangeLow', true), high: num('rangeHigh', true) });
    if (Object.keys(range).length) setup.expectedRange = range;
  }
  // stored only when chosen: a study without one follows the phone's locale (web/app/number-style.ts), and
  // a position warning without a setting is at 30 m
  if (f.sep) setup.decimalSeparator = f.sep;
  const warnM = num('positionWarnM', true);
  if (warnM !== undefined && warnM !== 30) setup.positionWarnM = warnM;
  const tv = num('targetValue');
  if (tv !== undefined) {
    if (f.targetKind === 'limit') {
      const source = f.limitSource.trim();
      const date = f.limitDate.trim();
      if (!source) e.limitSource = 'Limit source: required (the regulation, plan or client that sets it).';
      if (!/^\d{4}-\d{2}-\d{2}$/.test(date))
        e.limitDate = 'Limit date: required, as a date (the version you apply).';
      setup.target = { kind: 'limit', value: tv / pct, source, date };
    } else setup.target = { kind: f.targetKind, value: tv / (f.targetKind === 'relative' ? 100 : pct) };
  }
  const customLevel = f.level === 'custom' ? num('customLevel') : undefined;
  setup.level =
    f.level === 'custom' ? (customLevel === undefined ? undefined : customLevel / 100) : Number(f.level);
  if (f.rule === 'sprt') {
    const lo = num('sprtLow');
    const hi = num('sprtHigh');
    setup.sprt = given({
      alpha: num('sprtAlpha'),
      beta: num('sprtBeta'),
      lowerBound: lo === undefined ? undefined : lo / pct,
      upperBound: hi === undefined ? undefined : hi / pct,
    });
  }
  setup.population = num('population', true);
  setup.min = num('min');
  const hot = num('hotSpot');
  setup.hotSpotShare = hot === undefined ? undefined : hot / 100;
  setup.max = num('max', true);
  if (f.kind === 'count') {
    const planning = given({
      negBinomialK: num('nbK', true),
      taylorA: num('taylorA', true),
      taylorB: num('taylorB', true),
      iwaoAlpha: num('iwaoAlpha', true),
      iwaoBeta: num('iwaoBeta', true),
    });
    if (Object.keys(planning).length) setup.planning = planning;
  }
  if (f.strata.trim() !== '') {
    const r = parseStrata(f.strata, f.strataCosts.trim() === '' ? undefined : f.strataCosts);
    const key = r.ok ? null : r.problem.startsWith('cost') ? 'strataCosts' : 'strata';
    if (!r.ok) e[key!] = `${LABEL[key!]}: ${r.problem}.`;
    else setup.strata = r.strata;
  } else if (f.strataCosts.trim() !== '') e.strataCosts = 'Effort per stratum: needs strata.';
  if (!f.ack) e.ack = 'Cautions: read them and tick the box to start.';
  // the form offers strict for pass/fail only (new-study.tsx says why); a duplicated older study may carry it
  if (f.rule === 'strict' && f.kind !== 'pass-fail')
    e.rule =
      'Stopping rule: strict is offered for pass/fail items only; choose standard or the limit decision.';
  const candidate = given(setup);
  // the validator's words under the field that sets the value; a field that could not be read keeps
  // the reason it could not
  for (const q of setupProblems(candidate)) {
    const key = fieldOf(q.path, f);
    e[key] ??= `${LABEL[key]}: ${q.message}`;
  }
  return Object.keys(e).length ? { errors: e } : { setup: candidate as unknown as StudySetup, name };
}

/**
 * The setup as far as the statistics go, for the live rule figures: the fields that only label the study
 * (name, unit, counted outcome, the limit's source and date, the cautions tick) are filled with stand-ins.
 */
export function previewSetup(f: Form): StudySetup | null {
  const r = buildSetup({
    ...f,
    name: 'preview',
    unit: f.unit.trim() || 'unit',
    outcome: f.outcome.trim() || 'outcome',
    limitSource: 'preview',
    limitDate: '2000-01-01',
    ack: true,
  });
  return 'setup' in r ? r.setup : null;
}
