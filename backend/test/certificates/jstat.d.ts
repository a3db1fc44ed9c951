// jstat ships no types; the tests use only the Student t quantile.
declare module 'jstat' {
  const jstat: { studentt: { inv(p: number, dof: number): number } };
  export default jstat;
}
