/**
 * Strata written as text — `woodland:0.6,meadow:0.4` (name:weight pairs), with optional efforts
 * `woodland:2,meadow:5` — as typed on the command line (`--strata`, `--cost`) and in the setup form.
 * Not a statistical method: a small parser shared by src/cli and web so both read the same syntax.
 * Preconditions: none (any text). Returns: the strata, or the first problem in words (name, position).
 * Weights are numbers (area shares, hectares or unit counts; rescaled later); a decimal comma is accepted
 * when the list uses `;` between strata. Only the syntax is checked here: whether the weights, efforts and
 * names make valid strata (weight > 0, names distinct, at least two) is the setup validator's
 * (src/model/setup.ts), so the command line, the form and an imported bundle word it the same way.
 * @example parseStrata('woodland:0.6,meadow:0.4') // { ok: true, strata: [{ name: 'woodland', weight: 0.6 }, …] }
 */
import type { StratumSetup } from '../model/types.ts';

export type StrataParse = { ok: true; strata: StratumSetup[] } | { ok: false; problem: string };

function pairs(text: string): string[] {
  const t = text.trim();
  return (t.includes(';') ? t.split(';') : t.split(',')).map((s) => s.trim()).filter((s) => s !== '');
}

function number(s: string): number {
  const t = s.trim().replace(',', '.');
  return /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/.test(t) ? Number(t) : Number.NaN;
}

export function parseStrata(text: string, costs?: string): StrataParse {
  const strata: StratumSetup[] = [];
  for (const part of pairs(text)) {
    const i = part.lastIndexOf(':');
    if (i <= 0) return { ok: false, problem: `stratum "${part}": write name:weight` };
    const name = part.slice(0, i).trim();
    const weight = number(part.slice(i + 1));
    if (name === '') return { ok: false, problem: `stratum "${part}": the name is empty` };
    if (!Number.isFinite(weight))
      return { ok: false, problem: `stratum "${name}": the weight must be a number` };
    strata.push({ name, weight });
  }
  if (strata.length === 0) return { ok: false, problem: 'no strata given' };
  if (costs !== undefined) {
    for (const part of pairs(costs)) {
      const i = part.lastIndexOf(':');
      const name = i > 0 ? part.slice(0, i).trim() : '';
      const cost = i > 0 ? number(part.slice(i + 1)) : Number.NaN;
      const s = strata.find((x) => x.name === name);
      if (s === undefined) return { ok: false, problem: `cost "${part}": no stratum of that name` };
      if (!Number.isFinite(cost)) return { ok: false, problem: `cost for "${name}": must be a number` };
      s.cost = cost;
    }
  }
  return { ok: true, strata };
}

/** The inverse of parseStrata (weights, then costs when any stratum has one). */
export function formatStrata(strata: readonly StratumSetup[]): { strata: string; costs?: string } {
  const out: { strata: string; costs?: string } = {
    strata: strata.map((s) => `${s.name}:${s.weight}`).join(','),
  };
  if (strata.some((s) => s.cost !== undefined))
    out.costs = strata.map((s) => `${s.name}:${s.cost ?? 1}`).join(',');
  return out;
}
