// jStat 1.9.6 ships no type declarations; these cover the functions the engine uses.
declare module 'jstat' {
  interface ContinuousDistribution {
    pdf(x: number, ...params: number[]): number;
    cdf(x: number, ...params: number[]): number;
    inv(p: number, ...params: number[]): number;
  }
  interface JStatStatic {
    chisquare: ContinuousDistribution;
    beta: ContinuousDistribution;
    gamma: ContinuousDistribution;
    normal: ContinuousDistribution;
    studentt: ContinuousDistribution;
    gammaln(x: number): number;
    gammafn(x: number): number;
    lowRegGamma(a: number, x: number): number;
    ibeta(x: number, a: number, b: number): number;
  }
  const jStat: JStatStatic;
  export default jStat;
  export { jStat };
}
