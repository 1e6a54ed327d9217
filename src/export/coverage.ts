/**
 * The stopping rules' measured coverage, in words for the report's method statement.
 *
 * Source: this project's coverage benchmark (test/bench/coverage.md; METHODS §7 grid). Figures are
 * transcribed here by hand when the benchmark is re-run; a rule or data kind without a figure gives null,
 * and the report then says "not yet measured".
 */
import type { DataKind, RuleName } from '../model/types.ts';

/** Realised coverage per rule and data kind, as a sentence fragment. Empty until the benchmark lands. */
export const MEASURED_COVERAGE: Partial<Record<RuleName, Partial<Record<DataKind, string>>>> = {};

export function coverageStatement(setup: { rule: RuleName; kind: DataKind }): string | null {
  return MEASURED_COVERAGE[setup.rule]?.[setup.kind] ?? null;
}
