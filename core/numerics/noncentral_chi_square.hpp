// Noncentral chi-square distribution (df, noncentrality lambda): upper and lower tails, each
// computed directly from Boost.Math 1.74's non_central_chi_squared (Ding 1992 / Benton and
// Krishnamoorthy 2003 Poisson-mixture sums), the upper one through complement, never 1 - cdf.
// Accuracy: about 1e-12 relative against SciPy 1.10 / R 4.2 in tests/reference/power.csv.
#pragma once

namespace tallyproof {

double noncentral_chi_square_upper_tail(double x, double df, double lambda);  // P(X >= x); NaN if df <= 0, lambda < 0
double noncentral_chi_square_lower_tail(double x, double df, double lambda);  // P(X <= x); NaN if df <= 0, lambda < 0

}  // namespace tallyproof
