// Noncentral chi-square density points (Boost.Math 1.74 non_central_chi_squared pdf, Benton and
// Krishnamoorthy 2003 series); the y range is the largest sample times 1.1.
#include "noncentral_chi_square_density_curve.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

#include <boost/math/distributions/non_central_chi_squared.hpp>

#include "chi_square_tail.hpp"
#include "math_policy.hpp"

namespace tallyproof {

double noncentral_chi_square_density(double x, double df, double lambda) {
    if (!(df > 0) || !(lambda >= 0) || std::isinf(lambda) || std::isnan(x)) return std::numeric_limits<double>::quiet_NaN();
    if (x < 0) return 0;
    if (lambda == 0) return chi_square_density(x, df);
    if (x == 0 && df < 2) return std::numeric_limits<double>::infinity();
    boost::math::non_central_chi_squared_distribution<double, quiet_policy> dist(df, lambda);
    return boost::math::pdf(dist, x);
}

DensityCurve noncentral_density_curve(double df, double lambda, double critical_value, double statistic, int points) {
    DensityCurve c;
    points = std::max(points, 2);
    const double mean = df + lambda, sd = std::sqrt(2 * (df + 2 * lambda));
    double hi = std::max(mean + 4 * sd, std::isfinite(critical_value) ? 1.15 * critical_value : 0.0);
    if (std::isfinite(statistic) && statistic * 1.1 > hi) {
        if (statistic <= 2.5 * hi) hi = statistic * 1.1;
        else c.statistic_beyond = true;
    }
    c.x_min = 0;
    c.x_max = hi;
    double top = 0;
    for (int i = 0; i < points; ++i) {
        const double x = hi * i / (points - 1);
        double y = noncentral_chi_square_density(x, df, lambda);
        if (!std::isfinite(y)) y = 0;
        c.x.push_back(x);
        c.y.push_back(y);
        if (x > 0.02 * hi) top = std::max(top, y);  // a pole at 0 (df < 2) must not flatten the body
    }
    c.y_max = top > 0 ? 1.1 * top : 1;
    return c;
}

}  // namespace tallyproof
