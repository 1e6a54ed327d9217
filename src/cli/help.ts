/**
 * `sure-enough help [COMMAND]`: the full flag documentation (src/cli/README.md plus this build's own flags).
 */
import { METHODS_BY_KIND } from '../model/setup.ts';

const STUDY_FLAGS_TEXT = `Study flags (assess, bundle, replay):
  --kind measurement|count|pass-fail   the data kind (required)
                       measurement: a number with a unit; count: whole number per plot;
                       pass-fail: one item per line, 1 = the counted outcome (defect, present, fail), 0 = the other
  --level P            confidence level, 0 < P < 1 (default 0.95)
  --sided two|upper|lower
                       two-sided interval, or a one-sided upper / lower bound (default two). With a
                       limit target and "two", the bound on the estimate's side is checked: the upper
                       bound when the estimate is below the limit, the lower bound when above.
  --method NAME        interval method by its published name (default: the data kind's default)
                       measurement: ${METHODS_BY_KIND.measurement.join(', ')} (default auto)
                         auto       chosen from the data after every entry by D'Agostino's skewness test on the
                                    values and their logarithms: t, johnson-t, gamma or cox; the choice and its
                                    reason are in details.methodChoice
                         t          Student t (with the finite population correction when --population is given)
                         johnson-t  Johnson's (1978) modified t, moved for the skewness — skewed data with zeros
                         gamma      gamma-based (Grice & Bain 1980) — skewed positive data with left-skewed logs
                         cox        modified Cox, log scale (Olsson 2005: t quantile, 2(n−1)) — lognormal-like data
                         land       Land's exact method, log scale (computed by quadrature) — lognormal data vs a limit
                         chebyshev  Chebyshev bound from the mean and SD — strongly skewed, distribution unclear
                       count: ${METHODS_BY_KIND.count.join(', ')}
                         (default: poisson-exact unless the index-of-dispersion test at 5 % finds the
                         counts clumped, then t; the choice is stated in details.methodChoice)
                       pass-fail: ${METHODS_BY_KIND['pass-fail'].join(', ')} (default wilson)
                         With no counted outcome, an upper bound is the exact 1 − α^(1/n).
                         With --population (a finite lot), exact hypergeometric bounds are used.
  --target margin:D|relative:R|precision:D|limit:L
                       what "enough" means (default: none — interval only, verdict "keep going")
                         margin:D     half-width ≤ D in the data's units (a proportion for pass-fail)
                         relative:R   half-width ≤ R × estimate (R a fraction: 0.2 = ±20 %)
                         precision:D  SE / mean ≤ D (the ecologists' D; not a half-width: r = z·D)
                         limit:L      decide whether the mean / rate is below or above L
  --rule standard|strict|sprt|naive
                       stopping rule (default standard; sprt needs a limit target and --sprt-lower/-upper;
                       naive is for comparison only)
                       pass-fail targets are proportions: limit:L with 0 < L < 1, margin:D with D < 1
  --min N              observations before any verdict other than "keep going" (default 10)
  --hot-spot-share S   smallest share of the site or lot that must not go unseen, 0.1 or 10% (default 10%):
                       no verdict before the entries find such an area with 95 % probability (29 for 10 %);
                       the minimum is the larger of this and --min
  --population N       finite population or lot size, sampled without replacement (never fewer than n)
  --plot-area A        plot area for counts; densities are reported per unit of this area
  --max N              planned maximum number of observations, not below --min (also the SPRT truncation)
  --nb-k K             counts: negative-binomial k for planning "how many more" (Var = m + m²/k)
  --taylor-a A --taylor-b B
                       counts: Taylor's power law for planning (Var = A·m^B; A > 0, 0 < B ≤ 5)
  --iwao-alpha A --iwao-beta B
                       counts: Iwao's patchiness regression (used by the stop lines of the stopping rules;
                       A > −1)
  --sprt-alpha A --sprt-beta B --sprt-lower P0 --sprt-upper P1
                       Wald SPRT: error rates (default 0.05, 0.10; each strictly between 0 and 0.5) and the
                       indifference zone around the limit: 0 < P0 < L < P1 (P1 < 1 for pass-fail)

Field designs (see Input for the stratum and primary-unit columns):
  --strata "NAME:W,NAME:W"
                       declared strata with weights (area share, hectares or number of units;
                       rescaled to sum to 1), e.g. --strata "woodland:0.6,meadow:0.4". The estimate is the
                       stratified mean (Cochran 1977 ch. 5) with a Student t interval on Satterthwaite's
                       effective df; every stratum needs two entries (or two primary units) first.
                       details.whereNext names the stratum where one more entry narrows the interval most per unit of effort (with
                       details.whereNextMessage) and details["stratum.NAME.n" / ".mean" / ".sd"] the progress.
                       Use ; between strata to write weights with a decimal comma.
  --cost "NAME:C,..."  effort of one entry per stratum (minutes, money; default 1), used by "where next"
  --design composite   each value is one replicate composite (incremental sample; not with --strata): a
                       one-sided upper bound by Student t (or Chebyshev with --method chebyshev) from the replicates (ITRC ISM-1);
                       a single composite gives no bound. The minimum is min(--min, 3) replicates.
  --non-detects kaplan-meier|half-limit
                       how <RL results are used (measurements; default kaplan-meier: the Kaplan–Meier mean and
                       SD, Helsel 2012, with a Student t interval on n − 1 df). Above 50 % non-detects no mean is
                       given ("not-supportable"). half-limit replaces each <RL by RL/2 and says so in the
                       warnings — use it only where a regulation prescribes it. A warning is given when a
                       reporting limit is at or above a limit target.
  Primary units: when values carry a cluster (transect, room), the primary units are the replicates: ratio
  mean Σy/Σm with v = s_r²/(n·m̄²) (Cochran 1977 ch. 9), details.designEffect, details.effectiveN and a
  warning that the entries of one unit are not independent.`;

const INPUT_TEXT = `Input: FILE, or standard input when FILE is "-" or absent.
  One value per line; blank lines and lines starting with # are ignored; a decimal comma is accepted when the
  line holds one number (4,25 = 4.25). Or a CSV whose header has a "value" column (separator , ; or tab).
  pass-fail values are 0 or 1; counts are whole numbers ≥ 0. <RL (e.g. <0.5) marks a measurement below a
  reporting limit (a non-detect; see --non-detects).
  Field designs: a line may read value,stratum or value,stratum,cluster (value,,cluster for a primary unit
  without strata), e.g. "12,woodland,T3"; the second field must not start with a digit (4,2 is 4.2). A CSV
  may carry "stratum" and "cluster" columns beside "value". CSV is read by RFC 4180: quoted fields may hold
  the separator, "" for a quote and line breaks; a UTF-8 byte-order mark and CRLF are fine.
  The CSV export of a study (export --format csv) is read as it is: its value column (value_<unit>,
  count_per_plot, outcome_1_or_0; the last two also give --kind), counted rows only (voided entries and void
  records skipped), censored = true as a non-detect, stratum and cluster columns.
  A study bundle (.bundle.json) is read with its setup; study flags given replace those settings only, and
  "setupFrom" says which: flags, bundle, or bundle+flags. A bundle from a newer program version is refused.`;

const ASSESS_TEXT = `usage: sure-enough assess [FILE|-] --kind KIND [study flags]
       sure-enough assess STUDY.bundle.json [study flags that replace the bundle's]

Prints one JSON object:
  kind, n, estimate, lower, upper, level, sided, method   the interval the stopping rule reports (lower or
                       upper is null on the open side of a one-sided bound); level is the level the rule
                       reports (the standard rule checks at a calibrated, slightly higher level)
  verdict              "keep going" | "enough" | "below limit" | "above limit"
  reason               the verdict in plain words
  reasonCode           why "keep going": no-target, below-minimum, zero-spread, one-distinct-value, all-zero,
                       not-supportable, target-not-met, undecided (null for other verdicts)
  more                 null without a target or when the verdict is not "keep going"; otherwise further
                       observations: likely, low and high (10th–90th percentile range), assured (80 %
                       assurance, Kupper & Hafner 1989, where available) and atLeast: true before the
                       minimum ("at least M more"). The likely figure is smoothed: once n ≥ min it may change
                       by at most ±50 % of the previous entry's projected total (details.moreSmoothed,
                       details.moreRawLikely say when that happened).
  methodLabel          the method and rule in plain words
  details              sd, se, halfWidth, relativeHalfWidth, precision (SE/mean), dispersion index, densities…;
                       minimum (entries before any verdict), hotSpotShare, unseenShare (the largest share of
                       the site n random entries all miss 1 time in 20), spreadJumpEntry/Value/Ratio (the
                       first value that more than doubled the SD, a possible hot spot)
  warnings             plain-language warnings for this data (skew, clumping, ignored options…)
  setupFrom            "flags", "bundle" or "bundle+flags": where the setup came from
  input                "lines", "csv", "export" (a study's CSV export) or "bundle": how FILE was read

Errors (bad value on a line, bad flag, empty input): a message naming the line or flag on stderr, exit code 2,
nothing on stdout.`;

export function helpText(
  topic: string | undefined,
  commands: readonly (readonly [string, string])[],
): string {
  if (topic === 'assess') return `${ASSESS_TEXT}\n\n${STUDY_FLAGS_TEXT}\n\n${INPUT_TEXT}\n`;
  const list = commands.map(([k, s]) => `  ${k.padEnd(8)} ${s}`).join('\n');
  const head = `usage: sure-enough <command> [flags] [FILE|-]\n       sure-enough help [COMMAND]\n\nCommands:\n${list}`;
  if (topic !== undefined && !commands.some(([k]) => k === topic))
    return `no help topic "${topic}"\n\n${head}\n`;
  return `${head}\n\n${STUDY_FLAGS_TEXT}\n\n${INPUT_TEXT}\n`;
}
