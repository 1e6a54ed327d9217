import type { ObservationRecord } from '../core.ts';
import type { StoredStudy } from '../storage/schema.ts';
import { outcomeOf, unitOf } from './format.ts';

/** One entry in words, e.g. "12,4 mg/L", "< 0.5 mg/kg", "3 per plot", "defect". */
export function describeEntry(r: ObservationRecord, study: StoredStudy): string {
  if (r.value === undefined) return 'void';
  const k = study.setup.kind;
  if (k === 'pass-fail') return r.value ? outcomeOf(study) : `no ${outcomeOf(study)}`;
  return `${r.censored ? '< ' : ''}${r.value} ${unitOf(study)}`.trim();
}
