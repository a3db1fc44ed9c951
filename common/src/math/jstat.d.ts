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
  };
  export default jstat;
}
