// Points of the chi-square density for drawing, over a range that shows the body of the
// distribution and the critical value; a statistic far beyond that range is flagged so the
// chart can show it on a broken axis instead of squashing the curve.
#pragma once
#include <vector>

namespace tallyproof {

struct DensityCurve {
    std::vector<double> x, y;        // sample points, x ascending from x_min
    double x_min = 0;                // left end of the plotted range (0, or the body's start for large df)
    double x_max = 0;                // right end of the plotted range
    double y_max = 0;                // top of the plotted range; samples are at most 4 y_max (clip when drawing)
    bool statistic_beyond = false;   // the statistic lies far right of x_max (draw a broken axis)
};

// Range: from 0 (or mean - 6 sd for large df) to max(mean + 4 sd, 1.15 * critical), extended to
// 1.1 * statistic when that is at most 2.5 times the body's range; `points` samples (>= 2).
DensityCurve density_curve(double df, double critical_value, double statistic, int points = 241);

}  // namespace tallyproof
