// Power of the chi-square goodness-of-fit test and the sample size it needs (Cohen 1988,
// Statistical Power Analysis for the Behavioral Sciences, 2nd ed., ch. 7): under an alternative
// with effect size w the statistic is noncentral chi-square with lambda = N w^2. Accuracy is
// that of core/numerics/noncentral_chi_square (checked against statsmodels 0.13 and R 4.2, power.csv).
#pragma once
#include <vector>

#include "status.hpp"

namespace tallyproof {

// Power P(X >= critical value) with X ~ noncentral chi2(df, n w^2); NaN on a bad argument.
double gof_power(double w, double n, double alpha, double df);

// Cohen's w of an alternative against the null: sqrt(sum (p1 - p0)^2 / p0). Both share lists
// must have the same length >= 2, be non-negative, sum to 1 within 1e-9, and p0 > 0.
Status cohens_w_of_alternative(const std::vector<double>& null_shares, const std::vector<double>& alternative_shares,
                               double* w);

// Power against a stated alternative distribution, with df = k - 1 - estimated parameters.
Status gof_power_for_alternative(const std::vector<double>& null_shares, const std::vector<double>& alternative_shares,
                                 double n, double alpha, double df, double* power);

// Smallest whole N with gof_power(w, N, alpha, df) >= target_power (power rises with N).
Status gof_sample_size(double w, double target_power, double alpha, double df, double* n);

}  // namespace tallyproof
