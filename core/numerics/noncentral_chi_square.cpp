// Noncentral chi-square tails from Boost.Math 1.74 non_central_chi_squared with the quiet policy
// (Benton and Krishnamoorthy 2003, Comput. Stat. Data Anal. 43:249, as implemented there); the
// upper tail through boost::math::complement. lambda = 0 is the central distribution and goes
// to core/numerics/chi_square_tail, which is accurate to ~1e-14 there. For a noncentrality above 1e5 Boost's
// series becomes very slow (and overflows an int past 2^32), so the tails come from the normal
// approximation with the exact mean df + lambda and variance 2(df + 2 lambda) (Johnson, Kotz and
// Balakrishnan 1995, Continuous Univariate Distributions 2, ch. 29); its relative error in the
// body is below 1e-3 there, enough for power and interval ends reported to three digits.
#include "noncentral_chi_square.hpp"

#include <cmath>
#include <limits>

#include <boost/math/distributions/non_central_chi_squared.hpp>

#include "chi_square_tail.hpp"
#include "math_policy.hpp"

namespace tallyproof {
namespace {

bool bad(double x, double df, double lambda) {
    return std::isnan(x) || !(df > 0) || std::isinf(df) || !(lambda >= 0) || std::isinf(lambda);
}

constexpr double kNormalFrom = 1e5;  // noncentrality from which the normal approximation is used

// Upper (upper = true) or lower tail of N(df + lambda, 2 (df + 2 lambda)) at x, each from erfc.
double normal_tail(double x, double df, double lambda, bool upper) {
    const double z = (x - (df + lambda)) / std::sqrt(2 * (df + 2 * lambda));
    return 0.5 * std::erfc((upper ? z : -z) / std::sqrt(2.0));
}

}  // namespace

double noncentral_chi_square_upper_tail(double x, double df, double lambda) {
    if (bad(x, df, lambda)) return std::numeric_limits<double>::quiet_NaN();
    if (x <= 0) return 1.0;
    if (std::isinf(x)) return 0.0;
    if (lambda == 0) return chi_square_upper_tail(x, df).p;
    if (lambda > kNormalFrom || df > kNormalFrom) return normal_tail(x, df, lambda, true);
    boost::math::non_central_chi_squared_distribution<double, quiet_policy> dist(df, lambda);
    return boost::math::cdf(boost::math::complement(dist, x));
}

double noncentral_chi_square_lower_tail(double x, double df, double lambda) {
    if (bad(x, df, lambda)) return std::numeric_limits<double>::quiet_NaN();
    if (x <= 0) return 0.0;
    if (std::isinf(x)) return 1.0;
    if (lambda == 0) return chi_square_lower_tail(x, df).p;
    if (lambda > kNormalFrom || df > kNormalFrom) return normal_tail(x, df, lambda, false);
    boost::math::non_central_chi_squared_distribution<double, quiet_policy> dist(df, lambda);
    return boost::math::cdf(dist, x);
}

}  // namespace tallyproof
