// jstat 1.9 ships no type declarations; only the parts used here are typed.
declare module 'jstat' {
  type Distribution = {
    inv(p: number, ...params: number[]): number;
    cdf(x: number, ...params: number[]): number;
  };
  const jstat: {
    studentt: Distribution;
    chisquare: Distribution;
    normal: Distribution;
    /** Arithmetic mean (tests use it as an independent check). */
    mean(values: readonly number[]): number;
    /** Standard deviation; `sample` true divides by n − 1. */
    stdev(values: readonly number[], sample?: boolean): number;
  };
  export default jstat;
}
