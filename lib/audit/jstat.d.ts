/**
 * Minimal types for jstat 1.9.6 (dev dependency), used only as an independent oracle in lib/audit and lib/plan tests.
 */
declare module "jstat" {
  interface JStatOracle {
    beta: { inv(p: number, a: number, b: number): number; cdf(x: number, a: number, b: number): number };
    studentt: { inv(p: number, dof: number): number; cdf(t: number, dof: number): number };
    normal: { inv(p: number, mean: number, sd: number): number; cdf(x: number, mean: number, sd: number): number };
    centralF: { cdf(x: number, df1: number, df2: number): number };
    binomial: { cdf(k: number, n: number, p: number): number };
    erfc(x: number): number;
    mean(values: number[]): number;
    stdev(values: number[], sample?: boolean): number;
    ibeta(x: number, a: number, b: number): number;
    gammaln(x: number): number;
    percentile(values: number[], k: number, exclusive?: boolean): number;
    quantiles(values: number[], ps: number[], alphap?: number, betap?: number): number[];
  }
  const jStat: JStatOracle;
  export default jStat;
}
