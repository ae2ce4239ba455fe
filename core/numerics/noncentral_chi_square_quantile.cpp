// Noncentral chi-square quantile by bisection on the lower tail (monotone in x); the bracket
// starts at the mean df + lambda and doubles outward.
#include "noncentral_chi_square_quantile.hpp"

#include <cmath>
#include <limits>

#include "noncentral_chi_square.hpp"

namespace tallyproof {

double noncentral_chi_square_quantile(double p, double df, double lambda) {
    if (!(p > 0 && p < 1) || !(df > 0) || std::isinf(df) || !(lambda >= 0) || std::isinf(lambda))
        return std::numeric_limits<double>::quiet_NaN();
    auto cdf = [&](double x) { return noncentral_chi_square_lower_tail(x, df, lambda); };
    double lo = 0, hi = df + lambda;
    while (cdf(hi) < p) {
        lo = hi;
        hi *= 2;
        if (hi > 1e300) return std::numeric_limits<double>::quiet_NaN();
    }
    for (int i = 0; i < 400 && hi - lo > 1e-12 * hi; ++i) {
        const double mid = 0.5 * (lo + hi);
        if (cdf(mid) < p) lo = mid; else hi = mid;
    }
    return 0.5 * (lo + hi);
}

}  // namespace tallyproof
