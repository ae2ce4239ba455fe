// Density curve samples: values from the closed form of the df-2 density (exp(-x/2)/2) and
// the chart range rules stated in core/numerics/chi_square_density_curve.hpp.
#include <doctest/doctest.h>

#include <cmath>

#include "chi_square_tail.hpp"
#include "chi_square_density_curve.hpp"

using namespace tallyproof;

TEST_CASE("samples follow the density") {
    const DensityCurve c = density_curve(2, chi_square_critical_value(0.05, 2), 3.0);
    REQUIRE(c.x.size() == 241);
    for (std::size_t i = 0; i < c.x.size(); i += 40)
        CHECK(c.y[i] == doctest::Approx(std::exp(-c.x[i] / 2) / 2).epsilon(1e-13));  // closed form, df 2
    CHECK(c.x.front() == 0);
    CHECK(c.x_max >= 1.15 * chi_square_critical_value(0.05, 2));
    CHECK_FALSE(c.statistic_beyond);
}

TEST_CASE("a statistic far in the tail is flagged, not squashed into the range") {
    const DensityCurve near = density_curve(5, 11.07, 30.0);
    CHECK_FALSE(near.statistic_beyond);
    CHECK(near.x_max >= 30.0);
    const DensityCurve far = density_curve(5, 11.07, 5000.0);
    CHECK(far.statistic_beyond);
    CHECK(far.x_max < 100);
}

TEST_CASE("df 1 has a finite plotted top") {
    const DensityCurve c = density_curve(1, 3.84, 2.0);
    CHECK(std::isfinite(c.y_max));
    for (double y : c.y) CHECK(y <= 4 * c.y_max);
}

TEST_CASE("large df starts the range near the body") {
    const DensityCurve c = density_curve(10000, chi_square_critical_value(0.05, 10000), 10100);
    CHECK(c.x_min > 9000);
    CHECK(c.x_max > 10100);
}
