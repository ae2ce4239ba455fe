// Quantile of the noncentral chi-square distribution (df, noncentrality lambda): the x with
// P(X <= x) = p, by bracketing and bisection on core/numerics/noncentral_chi_square's lower tail (which
// rises with x), to 1e-12 relative. Checked against SciPy 1.10 ncx2.ppf in test_conformity.
#pragma once

namespace tallyproof {

double noncentral_chi_square_quantile(double p, double df, double lambda);  // NaN if p outside (0, 1), df <= 0, lambda < 0

}  // namespace tallyproof
