// Chi-square density samples (density from chi_square_density). For df < 2 the density is
// unbounded at 0; the plotted top is then taken from the sample at 2% of the range.
#include "chi_square_density_curve.hpp"

#include <algorithm>
#include <cmath>

#include "chi_square_tail.hpp"

namespace tallyproof {

DensityCurve density_curve(double df, double critical_value, double statistic, int points) {
    DensityCurve c;
    if (!(df > 0) || points < 2) return c;
    const double sd = std::sqrt(2 * df);
    const double x_min = df > 50 ? std::max(0.0, df - 6 * sd) : 0.0;
    double x_max = df + 4 * sd;
    if (std::isfinite(critical_value)) x_max = std::max(x_max, 1.15 * critical_value);
    if (std::isfinite(statistic) && statistic > x_max) {
        if (statistic - x_min <= 2.5 * (x_max - x_min)) x_max = x_min + 1.1 * (statistic - x_min);
        else c.statistic_beyond = true;
    }
    c.x_min = x_min;
    c.x_max = x_max;
    c.x.resize(points);
    c.y.resize(points);
    double top = 0;
    for (int i = 0; i < points; ++i) {
        const double x = x_min + (x_max - x_min) * i / (points - 1);
        const double y = chi_square_density(x, df);
        c.x[i] = x;
        c.y[i] = y;
        if (std::isfinite(y)) top = std::max(top, y);
    }
    if (df < 2) top = std::min(top, chi_square_density(x_min + 0.02 * (x_max - x_min), df));
    c.y_max = top > 0 ? top * 1.08 : 1.0;
    // Values above the plotted top (df < 2 near 0) are kept finite; the chart clips them.
    for (auto& y : c.y) y = std::isfinite(y) ? std::min(y, 4 * c.y_max) : 4 * c.y_max;
    return c;
}

}  // namespace tallyproof
