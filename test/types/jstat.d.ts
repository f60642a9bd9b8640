/**
 * Minimal type declarations for jstat 1.9 (a devDependency used only in tests as an independent second
 * implementation of distributions and summary statistics). Only the members our tests call are declared;
 * add more as needed. Shared by every test folder: extend this file rather than declaring "jstat" again.
 */
declare module "jstat" {
  interface ContinuousDistribution {
    pdf(x: number, ...parameters: number[]): number;
    cdf(x: number, ...parameters: number[]): number;
    inv(p: number, ...parameters: number[]): number;
    mean(...parameters: number[]): number;
    variance(...parameters: number[]): number;
  }
  interface DiscreteDistribution {
    pdf(k: number, ...parameters: number[]): number;
    cdf(k: number, ...parameters: number[]): number;
  }
  interface JStatStatic {
    normal: ContinuousDistribution;
    studentt: ContinuousDistribution;
    chisquare: ContinuousDistribution;
    beta: ContinuousDistribution;
    gamma: ContinuousDistribution;
    uniform: ContinuousDistribution;
    binomial: DiscreteDistribution;
    hypgeom: DiscreteDistribution;
    poisson: DiscreteDistribution;
    combination(n: number, k: number): number;
    combinationln(n: number, k: number): number;
    factorial(n: number): number;
    factorialln(n: number): number;
    gammaln(x: number): number;
    gammafn(x: number): number;
    gammap(a: number, x: number): number;
    gammapinv(p: number, a: number): number;
    ibeta(x: number, a: number, b: number): number;
    ibetainv(p: number, a: number, b: number): number;
    erf(x: number): number;
    erfc(x: number): number;
    sum(values: readonly number[]): number;
    cumsum(values: readonly number[]): number[];
    mean(values: readonly number[]): number;
    median(values: readonly number[]): number;
    variance(values: readonly number[], sample?: boolean): number;
    stdev(values: readonly number[], sample?: boolean): number;
    covariance(x: readonly number[], y: readonly number[]): number;
    corrcoeff(x: readonly number[], y: readonly number[]): number;
    quantiles(values: readonly number[], probabilities: readonly number[], alphap?: number, betap?: number): number[];
    percentile(values: readonly number[], k: number, exclusive?: boolean): number;
    ttest(...args: number[]): number;
  }
  const jStat: JStatStatic;
  export default jStat;
}
