// Nice tick steps: the smallest of 1, 2, 5 (times a power of ten) giving at most max_ticks intervals.
#include "axis_ticks.hpp"

#include <cmath>
#include <cstdio>

namespace tallyproof::web {

std::vector<double> nice_ticks(double lo, double hi, int max_ticks) {
    std::vector<double> ticks;
    if (!(hi > lo) || max_ticks < 2) return ticks;
    const double raw = (hi - lo) / max_ticks;
    const double mag = std::pow(10.0, std::floor(std::log10(raw)));
    double step = mag;
    for (double m : {1.0, 2.0, 5.0, 10.0}) {
        step = m * mag;
        if (step >= raw) break;
    }
    for (double v = std::ceil(lo / step) * step; v <= hi + step * 1e-9; v += step)
        ticks.push_back(std::fabs(v) < step * 1e-9 ? 0 : v);
    return ticks;
}

double nice_ceiling(double v) {
    if (!(v > 0)) return 1;
    const double mag = std::pow(10.0, std::floor(std::log10(v)));
    for (double m : {1.0, 2.0, 5.0, 10.0})
        if (m * mag >= v * (1 - 1e-12)) return m * mag;
    return 10 * mag;
}

std::string tick_label(double v) {
    char buf[32];
    std::snprintf(buf, sizeof buf, "%g", v);
    return buf;
}

}  // namespace tallyproof::web
