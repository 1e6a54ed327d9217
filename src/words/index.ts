/** The one module of words: see README.md. */
export { CAUTIONS } from './cautions.ts';
export { clockTime, crewCountWords, phoneWords, type SyncStateWords, syncLine, syncWord } from './crew.ts';
export { entryWords } from './entry.ts';
export {
  checkedLevelWords,
  estimateWords,
  intervalWords,
  methodChoiceWords,
  methodWords,
  type Shown,
  shownNumbers,
} from './figures.ts';
export { decimalsFor, fixed, levelWords, percent, plain, readable, withSeparator } from './numbers.ts';
export {
  confidenceWords,
  figureScale,
  figureUnit,
  kindWords,
  otherOutcomeWords,
  outcomeWords,
  ruleExplained,
  ruleWords,
  sidedWords,
  targetWords,
  valueUnit,
  withUnit,
} from './study.ts';
export {
  decisionWords,
  doneWords,
  minimumWords,
  moreWords,
  spreadJumpWords,
  unseenWords,
} from './verdict.ts';
