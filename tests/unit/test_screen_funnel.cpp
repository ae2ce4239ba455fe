// The screen's funnel: the chi-square quantile of the flag cut and w = sqrt((x* - df)/N) along N.
// Quantiles from SciPy 1.10 (scipy.stats.chi2.isf), named beside each check.
#include <doctest/doctest.h>

#include <cmath>

#include "screen_funnel.hpp"

using namespace tallyproof;

namespace {

GroupRow row(double n, double df, double p, bool flagged) {
    GroupRow g;
    g.tested = true;
    g.n = n;
    g.df = df;
    g.p = {p, std::log10(p)};
    g.flagged = flagged;
    return g;
}

}  // namespace

TEST_CASE("funnel: with nothing flagged the cut is q/m, the first step of BH, Holm and Bonferroni") {
    ScreenResult s;
    s.choice.q = 0.05;
    for (int i = 0; i < 40; ++i) s.groups.push_back(row(50 + 10 * i, 9, 0.2 + 0.01 * i, false));
    const ScreenFunnel f = screen_funnel(s, 16);
    REQUIRE(f.drawn);
    CHECK(f.df == 9);
    CHECK(f.statistic_cut == doctest::Approx(27.294789565713724).epsilon(1e-9));  // SciPy: chi2.isf(0.05/40, 9)
    REQUIRE(f.n.size() == 16);
    CHECK(f.n.front() == doctest::Approx(50 / 1.5));
    CHECK(f.n.back() == doctest::Approx(440 * 1.5));
    // Chance-corrected w, as each group's w (docs/methods.md: sqrt(max(0, X2 - df)/N)).
    for (std::size_t i = 0; i < f.n.size(); ++i) CHECK(f.w[i] == doctest::Approx(std::sqrt((f.statistic_cut - f.df) / f.n[i])));
    for (std::size_t i = 1; i < f.w.size(); ++i) CHECK(f.w[i] < f.w[i - 1]);  // a funnel: larger groups need less
}

TEST_CASE("funnel: with flags the cut is the largest flagged raw p, at the most common df") {
    ScreenResult s;
    s.choice.q = 0.05;
    s.groups = {row(100, 3, 0.001, true), row(200, 3, 0.003, true), row(150, 3, 0.4, false), row(90, 2, 0.6, false)};
    const ScreenFunnel f = screen_funnel(s);
    REQUIRE(f.drawn);
    CHECK(f.df == 3);
    CHECK(f.log10_p_cut == doctest::Approx(std::log10(0.003)));
    CHECK(f.statistic_cut == doctest::Approx(13.93142266551208).epsilon(1e-9));  // SciPy: chi2.isf(0.003, 3)
    s.choice.adjust = MultiplicityMethod::none;
    for (auto& g : s.groups) g.flagged = false;
    CHECK(screen_funnel(s).log10_p_cut == doctest::Approx(std::log10(0.05)));  // unadjusted: the cut is q
    ScreenResult empty;
    CHECK_FALSE(screen_funnel(empty).drawn);
}
