// jstat ships no type declarations; we declare the small part Lurk uses.
declare module 'jstat' {
  interface Distribution {
    cdf(x: number, ...params: number[]): number;
    inv(p: number, ...params: number[]): number;
    pdf(x: number, ...params: number[]): number;
  }
  const jStat: {
    normal: Distribution;
    studentt: Distribution;
    binomial: { pdf(k: number, n: number, p: number): number; cdf(k: number, n: number, p: number): number };
    centralF: Distribution;
    chisquare: Distribution;
    beta: Distribution;
    betinc(x: number, a: number, b: number): number;
    ibeta(x: number, a: number, b: number): number;
    ibetainv(p: number, a: number, b: number): number;
    gammaln(x: number): number;
    erf(x: number): number;
    erfc(x: number): number;
  };
  export default jStat;
}
