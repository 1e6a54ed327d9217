// Only the part of papaparse the one CSV reader (csv-read.ts) uses. The package ships no types, and
// @types/papaparse pulls in Node's types, which this folder must not see; keep this minimal so any new
// use of papaparse goes through csv-read.ts.
declare module 'papaparse' {
  interface ParseError {
    type: string;
    code: string;
    message: string;
    /** Character offset in the input where the problem was found (quote errors). */
    index?: number;
  }
  interface StepResult {
    data: string[];
    errors: ParseError[];
    /** Offset just past this record (its line break included). */
    meta: { cursor: number; linebreak: string };
  }
  interface Config {
    delimiter: string;
    quoteChar: string;
    escapeChar: string;
    header: false;
    dynamicTyping: false;
    skipEmptyLines: false;
    /** Lines starting with this text are skipped before parsing (so a quote in a comment is harmless). */
    comments: string | false;
    step(result: StepResult): void;
  }
  const Papa: { parse(input: string, config: Config): void };
  export default Papa;
}
