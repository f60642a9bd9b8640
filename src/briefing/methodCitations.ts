/**
 * The methods appendix of the briefing: each published method the tool uses, what it is used for,
 * and its citation (authors, year, title, publication).
 */

/** One method and its citation. */
export interface MethodCitation {
  readonly method: string;
  readonly use: string;
  readonly citation: string;
}

/**
 * Methods used by firephase with their full citations, in the order the briefing shows them.
 *
 * @example
 * METHOD_CITATIONS[0].method; // => "Wilson score interval"
 * @see the citation of each entry.
 */
export const METHOD_CITATIONS: readonly MethodCitation[] = Object.freeze([
  {
    method: "Wilson score interval",
    use: "95% interval of the chance of a high-fire year in a phase (default, no continuity correction)",
    citation:
      "Wilson E.B. (1927) \u201cProbable inference, the law of succession, and statistical inference\u201d, Journal of the American Statistical Association 22(158):209\u2013212; " +
      "compared in Newcombe R.G. (1998) \u201cTwo-sided confidence intervals for the single proportion: comparison of seven methods\u201d, Statistics in Medicine 17(8):857\u2013872.",
  },
  {
    method: "Jeffreys interval",
    use: "optional interval for a proportion: equal-tailed Beta(k+\u00bd, n\u2212k+\u00bd) quantiles",
    citation: "Brown L.D., Cai T.T., DasGupta A. (2001) \u201cInterval estimation for a binomial proportion\u201d, Statistical Science 16(2):101\u2013133.",
  },
  {
    method: "Pearson chi-square test of independence",
    use: "whether high-fire years are spread evenly over the phases of an index",
    citation:
      "Pearson K. (1900) \u201cOn the criterion that a given system of deviations from the probable in the case of a correlated system of variables is such that it can be reasonably supposed to have arisen from random sampling\u201d, Philosophical Magazine 50(302):157\u2013175.",
  },
  {
    method: "Adjusted standardized residuals",
    use: "which phase departs from independence, cell by cell",
    citation: "Agresti A. (2007) An Introduction to Categorical Data Analysis, 2nd edition, Wiley, \u00a72.4.5.",
  },
  {
    method: "Fisher exact test",
    use: "each phase against all other phases in a 2\u00d72 table, two-sided",
    citation: "Fisher R.A. (1935) The Design of Experiments, Oliver & Boyd, Edinburgh.",
  },
  {
    method: "Odds ratio with Woolf interval",
    use: "odds of a high-fire year in a phase against the other phases, 95% log-scale interval (Haldane \u00bd added to every cell when one is zero, marked *)",
    citation: "Woolf B. (1955) \u201cOn estimating the relation between blood group and disease\u201d, Annals of Human Genetics 19(4):251\u2013253.",
  },
  {
    method: "Superposed epoch analysis",
    use: "mean index departure in the years around high-fire years, with limits from random key years",
    citation:
      "Haurwitz M.W., Brier G.W. (1981) \u201cA critique of the superposed epoch analysis method: its application to solar\u2013weather relations\u201d, Monthly Weather Review 109:2074\u20132079; " +
      "Prager M.H., Hoenig J.M. (1989) \u201cSuperposed epoch analysis: a randomization test of environmental effects on recruitment with application to chub mackerel\u201d, Transactions of the American Fisheries Society 118:608\u2013618; " +
      "Adams J.B., Mann M.E., Ammann C.M. (2003) \u201cProxy evidence for an El Ni\u00f1o-like response to volcanic forcing\u201d, Nature 426:274\u2013278.",
  },
  {
    method: "Resampling p-values",
    use: "p = (b + 1) / (m + 1) from m random draws, never zero",
    citation:
      "Phipson B., Smyth G.K. (2010) \u201cPermutation p-values should never be zero: calculating exact p-values when permutations are randomly drawn\u201d, Statistical Applications in Genetics and Molecular Biology 9(1): Article 39.",
  },
  {
    method: "Effective sample size of a correlation",
    use: "p-values of block correlations between autocorrelated series: N times (1 \u2212 a × b)/(1 + a × b), a and b the lag-1 autocorrelations",
    citation:
      "Bretherton C.S., Widmann M., Dymnikov V.P., Wallace J.M., Blad\u00e9 I. (1999) \u201cThe effective number of spatial degrees of freedom of a time-varying field\u201d, Journal of Climate 12:1990\u20132009.",
  },
  {
    method: "Benjamini\u2013Hochberg false discovery rate",
    use: "q-values beside the raw p-values across all indices\u2019 tests",
    citation:
      "Benjamini Y., Hochberg Y. (1995) \u201cControlling the false discovery rate: a practical and powerful approach to multiple testing\u201d, Journal of the Royal Statistical Society B 57(1):289\u2013300.",
  },
  {
    method: "Sample quantiles",
    use: "terciles of activity and of index values (type 7)",
    citation: "Hyndman R.J., Fan Y. (1996) \u201cSample quantiles in statistical packages\u201d, The American Statistician 50(4):361\u2013365.",
  },
  {
    method: "Brier score and Brier skill score",
    use: "hindcast accuracy of the high-fire-year chance against the average-year forecast",
    citation: "Brier G.W. (1950) \u201cVerification of forecasts expressed in terms of probability\u201d, Monthly Weather Review 78(1):1\u20133.",
  },
  {
    method: "Ranked probability score and skill score",
    use: "hindcast accuracy of the below / near / above odds",
    citation:
      "Epstein E.S. (1969) \u201cA scoring system for probability forecasts of ranked categories\u201d, Journal of Applied Meteorology 8:985\u2013987; " +
      "Murphy A.H. (1971) \u201cA note on the ranked probability score\u201d, Journal of Applied Meteorology 10:155\u2013156.",
  },
  {
    method: "ROC curve and area",
    use: "how well the hindcast tells high-fire years from other years, with the area\u2019s standard error",
    citation:
      "Hanley J.A., McNeil B.J. (1982) \u201cThe meaning and use of the area under a receiver operating characteristic (ROC) curve\u201d, Radiology 143(1):29\u201336.",
  },
  {
    method: "Logistic regression, with Firth's penalized likelihood",
    use: "response curve: how the chance of a high-fire year changes with the index value (maximum likelihood; Firth's penalty when the record separates high-fire years completely); Wald band on the logit scale",
    citation:
      "Hosmer D.W., Lemeshow S., Sturdivant R.X. (2013) Applied Logistic Regression, 3rd edition, Wiley, Hoboken NJ; " +
      "Firth D. (1993) \u201cBias reduction of maximum likelihood estimates\u201d, Biometrika 80(1):27\u201338; " +
      "Heinze G., Schemper M. (2002) \u201cA solution to the problem of separation in logistic regression\u201d, Statistics in Medicine 21(16):2409\u20132419.",
  },
  {
    method: "Breslow\u2013Day test with Tarone's correction",
    use: "whether an index's link (odds ratio) is the same in the fire-scar era and the modern record",
    citation:
      "Breslow N.E., Day N.E. (1980) Statistical Methods in Cancer Research, Volume I: The Analysis of Case-Control Studies, IARC Scientific Publications 32, Lyon; " +
      "Tarone R.E. (1985) \u201cOn heterogeneity tests based on efficient scores\u201d, Biometrika 72(1):91\u201395.",
  },
  {
    method: "Cohen's kappa",
    use: "how often the fire-scar and the modern record agree on a high-fire year, beyond chance",
    citation: "Cohen J. (1960) \u201cA coefficient of agreement for nominal scales\u201d, Educational and Psychological Measurement 20(1):37\u201346.",
  },
  {
    method: "Moving-block bootstrap",
    use: "intervals of the hindcast scores (Brier skill score, RPSS, ROC area) and the selection-aware interval of the headline odds, keeping neighbouring years together",
    citation: "K\u00fcnsch H.R. (1989) \u201cThe jackknife and the bootstrap for general stationary observations\u201d, Annals of Statistics 17(3):1217\u20131241.",
  },
  {
    method: "Permutation test of skill",
    use: "chance test of the hindcast: the fire record shuffled across years in blocks and the whole hindcast rerun; p = (b + 1)/(m + 1)",
    citation:
      "Phipson B., Smyth G.K. (2010) \u201cPermutation p-values should never be zero: calculating exact p-values when permutations are randomly drawn\u201d, " +
      "Statistical Applications in Genetics and Molecular Biology 9(1): Article 39.",
  },
  {
    method: "One-step case deletion",
    use: "the curve rule's chance test: in each fold of every shuffle the curves fitted to all years are moved to the fold's years by one Newton step instead of being refitted (the reported curve-rule scores are exact refits)",
    citation:
      "Pregibon D. (1981) \u201cLogistic regression diagnostics\u201d, Annals of Statistics 9(4):705\u2013724; " +
      "Cook R.D., Weisberg S. (1982) Residuals and Influence in Regression, Chapman & Hall, New York.",
  },
  {
    method: "Fixed event definition in cross-validation",
    use: "the high-fire threshold and the terciles are set once from the whole period, so leaving a year out cannot move the event it is scored on",
    citation:
      "Barnston A.G., van den Dool H.M. (1993) \u201cA degeneracy in cross-validated skill in regression-based forecasts\u201d, Journal of Climate 6(5):963\u2013977.",
  },
  {
    method: "CORP reliability diagram",
    use: "reliability of the hindcast: isotonic (pool-adjacent-violators) recalibration, consistency band under calibration, and the Brier score split into miscalibration, discrimination and uncertainty",
    citation:
      "Dimitriadis T., Gneiting T., Jordan A.I. (2021) \u201cStable reliability diagrams for probabilistic classifiers\u201d, Proceedings of the National Academy of Sciences 118(8):e2016191118; " +
      "Ayer M., Brunk H.D., Ewing G.M., Reid W.T., Silverman E. (1955) \u201cAn empirical distribution function for sampling with incomplete information\u201d, Annals of Mathematical Statistics 26(4):641\u2013647.",
  },
] as const);
