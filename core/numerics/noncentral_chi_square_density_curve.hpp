// Points of the noncentral chi-square density (df, noncentrality lambda) for drawing the
// conformity test: the curve under "the mix departs by exactly w0", its alpha quantile and the
// observed statistic. Density from Boost.Math 1.74 non_central_chi_squared pdf (quiet policy).
#pragma once
#include "chi_square_density_curve.hpp"

namespace tallyproof {

double noncentral_chi_square_density(double x, double df, double lambda);  // 0 for x < 0; NaN on bad arguments

// Range 0 to max(mean + 4 sd, 1.15 * critical, 1.1 * statistic) when the statistic is within 2.5
// body widths; otherwise the statistic is flagged beyond (as density_curve does).
DensityCurve noncentral_density_curve(double df, double lambda, double critical_value, double statistic, int points = 241);

}  // namespace tallyproof
