// Axis ticks for the charts: "nice" steps of 1, 2 or 5 times a power of ten (common practice
// for chart axes), and the tick label text.
#pragma once
#include <string>
#include <vector>

namespace tallyproof::web {

std::vector<double> nice_ticks(double lo, double hi, int max_ticks);  // ascending, within [lo, hi]
double nice_ceiling(double v);                                        // the smallest 1/2/5 x 10^k >= v
std::string tick_label(double v);                                     // "%g"

}  // namespace tallyproof::web
