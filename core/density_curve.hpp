// Points of the chi-square density for drawing, over a range that shows the body of the
// distribution, the critical value and (where it fits) the observed statistic.
#pragma once
#include <vector>

namespace tallyproof {

struct DensityCurve {
    std::vector<double> x, y;  // sample points, x ascending from 0
    double x_max = 0;          // right end of the plotted range
    double y_max = 0;          // top of the plotted range (finite even where the density is not)
};

// Range: 0 .. max(mean + 4 sd, 1.15 * critical, 1.1 * statistic); `points` samples (>= 2).
DensityCurve density_curve(double df, double critical_value, double statistic, int points = 241);

}  // namespace tallyproof
