// jstat ships no type declarations; only the Student-t and χ² pieces the reference tests use.
declare module 'jstat' {
  interface ContinuousDistribution {
    cdf(x: number, dof: number): number;
    inv(p: number, dof: number): number;
  }
  export const jStat: { studentt: ContinuousDistribution; chisquare: ContinuousDistribution };
}
