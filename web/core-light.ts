/**
 * Core helpers that carry no statistics (and so no jstat), safe to import statically from the app shell.
 * Everything else from src/ is reached through ./core-loader.ts.
 */
export { formatStrata, parseStrata } from '../src/design/strata-spec.ts';
export {
  DATA_KINDS,
  RULES,
  SETUP_DEFAULTS,
  type SetupProblem,
  setupProblems,
  TARGET_KINDS,
} from '../src/model/setup.ts';
export { formatCrewCode, normalizeCrewCode } from '../src/sync/crew-code.ts';
export * from '../src/words/index.ts';
