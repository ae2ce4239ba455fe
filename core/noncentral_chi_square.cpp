// Noncentral chi-square tails from Boost.Math 1.74 non_central_chi_squared with the quiet policy
// (Benton and Krishnamoorthy 2003, Comput. Stat. Data Anal. 43:249, as implemented there); the
// upper tail through boost::math::complement. lambda = 0 is the central distribution and goes
// to core/chi_square_tail, which is accurate to ~1e-14 there.
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

}  // namespace

double noncentral_chi_square_upper_tail(double x, double df, double lambda) {
    if (bad(x, df, lambda)) return std::numeric_limits<double>::quiet_NaN();
    if (x <= 0) return 1.0;
    if (std::isinf(x)) return 0.0;
    if (lambda == 0) return chi_square_upper_tail(x, df).p;
    boost::math::non_central_chi_squared_distribution<double, quiet_policy> dist(df, lambda);
    return boost::math::cdf(boost::math::complement(dist, x));
}

double noncentral_chi_square_lower_tail(double x, double df, double lambda) {
    if (bad(x, df, lambda)) return std::numeric_limits<double>::quiet_NaN();
    if (x <= 0) return 0.0;
    if (std::isinf(x)) return 1.0;
    if (lambda == 0) return chi_square_lower_tail(x, df).p;
    boost::math::non_central_chi_squared_distribution<double, quiet_policy> dist(df, lambda);
    return boost::math::cdf(dist, x);
}

}  // namespace tallyproof
