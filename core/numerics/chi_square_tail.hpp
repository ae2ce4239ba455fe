// Chi-square distribution: tail probabilities (upper and lower, with log10), density and
// quantile. Tails come from the regularized incomplete gamma in complement form, never 1 - cdf,
// with logarithms computed directly where the tail underflows (core/numerics/log_incomplete_gamma).
// Accuracy against a 50-digit mpmath grid: see tests/reference/chi_square_tails.csv.
#pragma once

namespace tallyproof {

// A tail probability with its base-10 logarithm. `p` is the double value (it may underflow to
// 0 when the true tail is below ~1e-308); `log10_p` is always finite for finite x > 0 and is
// computed directly, so it stays exact where `p` cannot hold the value.
struct TailProbability {
    double p = 1.0;
    double log10_p = 0.0;
};

TailProbability chi_square_upper_tail(double x, double df);  // P(X >= x), X ~ chi2(df)
TailProbability chi_square_lower_tail(double x, double df);  // P(X <= x)
double chi_square_density(double x, double df);              // pdf at x (0 for x < 0)
double chi_square_critical_value(double alpha, double df);   // x with P(X >= x) = alpha
// x with log10 P(X >= x) = log10_alpha, for any log10_alpha < 0 (e.g. -5000); 0 when it is 0.
double chi_square_critical_value_log10(double log10_alpha, double df);

}  // namespace tallyproof
