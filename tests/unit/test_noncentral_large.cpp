// Noncentral chi-square at very large noncentrality, where core/numerics/noncentral_chi_square switches to
// the normal approximation (it must stay fast and close to the true tails).
#include <doctest/doctest.h>


#include "effect_size.hpp"
#include "noncentral_chi_square.hpp"
#include "power_analysis.hpp"

using namespace tallyproof;

TEST_CASE("tails at noncentrality 2e5 and 1e9 agree with SciPy within 1e-3 relative") {
    // Source: SciPy 1.10 scipy.stats.ncx2.sf / .cdf, run on Debian 12.
    CHECK(noncentral_chi_square_upper_tail(201000, 5, 2e5) == doctest::Approx(0.1330318090860124).epsilon(1e-3));
    CHECK(noncentral_chi_square_lower_tail(199500, 5, 2e5) == doctest::Approx(0.2864309156464693).epsilon(1e-3));
    CHECK(noncentral_chi_square_upper_tail(1.00005e9, 3, 1e9) == doctest::Approx(0.21460976436453302).epsilon(1e-3));
}

TEST_CASE("huge statistics give an interval and a power, not a hang") {
    // Closed form for the check: with X2 = 2.5e9 and N = 1000, w = sqrt(X2 / N) ~ 1581; the 95%
    // interval must contain it and be narrow (common practice: the interval shrinks as X2 grows).
    EffectSizeInterval iv;
    REQUIRE(cohens_w_interval(2.5e9, 1000, 1, 0.95, &iv).ok);
    CHECK(iv.lower < iv.estimate);
    CHECK(iv.upper > iv.estimate);
    CHECK((iv.upper - iv.lower) / iv.estimate < 1e-3);
    // Power at N w^2 = 8.6e9 is 1 to double precision.
    CHECK(gof_power(40.1, 5.4e6, 0.05, 8) == doctest::Approx(1.0));
}
