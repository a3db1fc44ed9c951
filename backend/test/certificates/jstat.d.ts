// jstat ships no types; the tests use only the Student t quantile and the normal CDF.
declare module 'jstat' {
  const jstat: { studentt: { inv(p: number, dof: number): number }; normal: { cdf(x: number, mean: number, sd: number): number } };
  export default jstat;
}
