// The funnel of a screen: the effect size w a group of size N needs to be flagged. Flagging is a
// cut on the raw p-value (for BH, Holm and Bonferroni at this screen's data, the largest raw p
// that was flagged; with none flagged, the cut the smallest p would have had to pass, q/m, which
// is the first step of all three), so a group is flagged when its statistic reaches the chi-square
// quantile x* of that cut: in the chance-corrected w each group carries, w = √(max(0, x* − df)/N)
// (a group's w is that of its own df; the curve uses the most common df). The curve is drawn with each group as a point (N, w).
// Common practice for funnel plots of screened units; no single published source.
#pragma once
#include <vector>

#include "screen_groups.hpp"

namespace tallyproof {

struct ScreenFunnel {
    bool drawn = false;        // false: fewer than one tested group, or no common df
    double log10_p_cut = 0;    // log10 of the raw p-value a group must reach to be flagged
    double df = 0;             // the df the curve uses (the most common df of the tested groups)
    double statistic_cut = 0;  // the chi-square quantile of the cut at that df
    std::vector<double> n;     // sample sizes along the curve, log-spaced over the groups' range
    std::vector<double> w;     // √(max(0, statistic_cut − df) / n)
};

// The funnel over `points` sample sizes from the smallest to the largest tested group (widened
// by a factor 1.5 each way). Never throws.
ScreenFunnel screen_funnel(const ScreenResult& screen, int points = 64);

}  // namespace tallyproof
