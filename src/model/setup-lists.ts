/**
 * The one list of what a study setup may choose: data kinds, interval methods per kind, stopping rules,
 * sidedness, target kinds, designs, non-detect handling, and the defaults when nothing is chosen. The form,
 * the command line, the bundle validator and the core all read these (through setup.ts); none keeps its own.
 */
import type {
  AnalysisSetup,
  CountMethod,
  DataKind,
  MeasurementMethod,
  MethodName,
  PassFailMethod,
  RuleName,
  Sided,
  Target,
} from './types.ts';

export const DATA_KINDS: readonly DataKind[] = ['measurement', 'count', 'pass-fail'];

/** Interval methods of each data kind by their published names; the first is not always the default. */
export const METHODS_BY_KIND: Readonly<Record<DataKind, readonly MethodName[]>> = {
  measurement: ['auto', 't', 'johnson-t', 'gamma', 'cox', 'land', 'chebyshev'] satisfies MeasurementMethod[],
  count: ['t', 'poisson-exact', 'quasi-poisson'] satisfies CountMethod[],
  'pass-fail': [
    'wilson',
    'wilson-cc',
    'jeffreys',
    'clopper-pearson',
    'agresti-coull',
  ] satisfies PassFailMethod[],
};

export const RULES: readonly RuleName[] = ['standard', 'strict', 'sprt', 'naive'];
export const SIDEDNESS: readonly Sided[] = ['two', 'upper', 'lower'];
export const TARGET_KINDS: readonly Target['kind'][] = ['margin', 'relative', 'precision', 'limit'];
export const DESIGNS: readonly NonNullable<AnalysisSetup['design']>[] = ['composite'];
export const NON_DETECTS: readonly NonNullable<AnalysisSetup['nonDetects']>[] = [
  'kaplan-meier',
  'half-limit',
];

/** What a setup gets when the user says nothing (form defaults and command-line defaults). */
export const SETUP_DEFAULTS = {
  level: 0.95,
  sided: 'two',
  rule: 'standard',
  min: 10,
  hotSpotShare: 0.1,
  sprtAlpha: 0.05,
  sprtBeta: 0.1,
} as const satisfies {
  level: number;
  sided: Sided;
  rule: RuleName;
  min: number;
  hotSpotShare: number;
  sprtAlpha: number;
  sprtBeta: number;
};
