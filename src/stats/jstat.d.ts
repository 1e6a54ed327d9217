// Only the jstat functions the facade uses. There is no @types/jstat; keep this list minimal so any new
// use of jstat has to go through src/stats/distributions.ts and be checked there.
declare module 'jstat' {
  interface Continuous {
    inv(p: number, ...params: number[]): number;
    cdf(x: number, ...params: number[]): number;
  }
  export const jStat: {
    normal: Continuous;
    studentt: Continuous;
    chisquare: Continuous;
    beta: Continuous;
    gamma: Continuous;
    lowRegGamma(a: number, x: number): number;
    ibeta(x: number, a: number, b: number): number;
    gammaln(x: number): number;
  };
}
