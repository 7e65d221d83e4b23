// jstat ships no type declarations; these cover only the functions the stats tests use as oracles.
declare module 'jstat' {
  interface JStatStatic {
    binomial: {
      pdf(k: number, n: number, p: number): number;
      cdf(k: number, n: number, p: number): number;
    };
    /** k successes in n draws from a population of N holding m successes. */
    hypgeom: {
      pdf(k: number, N: number, m: number, n: number): number;
      cdf(k: number, N: number, m: number, n: number): number;
    };
    normal: {
      cdf(x: number, mean: number, sd: number): number;
      inv(p: number, mean: number, sd: number): number;
    };
    erfc(x: number): number;
    factorialln(n: number): number;
    gammaln(x: number): number;
    /** Regularised incomplete beta function I_x(a, b). */
    ibeta(x: number, a: number, b: number): number;
  }
  const jStat: JStatStatic;
  export default jStat;
}
