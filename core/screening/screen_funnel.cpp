// The funnel of a screen: w needed at each N for a flag (see screen_funnel.hpp). The quantile is
// the chi-square upper-tail inverse of chi_square_tail.hpp, in log space for cuts below 1e-300.
#include "screen_funnel.hpp"

#include <algorithm>
#include <cmath>
#include <map>

#include "chi_square_tail.hpp"

namespace tallyproof {

ScreenFunnel screen_funnel(const ScreenResult& screen, int points) {
    ScreenFunnel f;
    std::map<double, int> df_count;
    double n_lo = INFINITY, n_hi = 0, flagged_cut = -INFINITY;
    std::size_t tested = 0;
    for (const GroupRow& g : screen.groups) {
        if (!g.tested) continue;
        ++tested;
        ++df_count[g.df];
        n_lo = std::min(n_lo, g.n);
        n_hi = std::max(n_hi, g.n);
        if (g.flagged) flagged_cut = std::max(flagged_cut, g.p.log10_p);
    }
    if (tested == 0 || df_count.empty() || !(n_lo > 0) || points < 2) return f;
    f.df = std::max_element(df_count.begin(), df_count.end(), [](const auto& a, const auto& b) { return a.second < b.second; })->first;
    if (!(f.df > 0)) return f;
    const double m = static_cast<double>(tested);
    const double first_step = screen.choice.adjust == MultiplicityMethod::none ? screen.choice.q : screen.choice.q / m;
    f.log10_p_cut = std::isfinite(flagged_cut) ? flagged_cut : std::log10(first_step);
    f.statistic_cut = chi_square_critical_value_log10(f.log10_p_cut, f.df);
    if (!(f.statistic_cut > 0)) return f;
    const double lo = std::log(n_lo / 1.5), hi = std::log(std::max(n_hi, n_lo) * 1.5);
    for (int i = 0; i < points; ++i) {
        const double n = std::exp(lo + (hi - lo) * i / (points - 1));
        f.n.push_back(n);
        f.w.push_back(std::sqrt(std::max(0.0, f.statistic_cut - f.df) / n));
    }
    f.drawn = true;
    return f;
}

}  // namespace tallyproof
