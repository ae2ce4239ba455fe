// Chi-square tails, density and critical values against published tables and closed forms.
#include <doctest/doctest.h>

#include <cmath>
#include <initializer_list>

#include "chi_square_tail.hpp"

using namespace tallyproof;

TEST_CASE("upper 5% critical values for df 1-10") {
    // Source: the upper 5% points printed in standard chi-square tables (e.g. NIST/SEMATECH
    // e-Handbook of Statistical Methods, 1.3.6.7.4), to three decimals; recalled from memory
    // and confirmed with SciPy 1.10 scipy.stats.chi2.isf(0.05, df).
    const double table[] = {3.841, 5.991, 7.815, 9.488, 11.070, 12.592, 14.067, 15.507, 16.919, 18.307};
    for (int df = 1; df <= 10; ++df) {
        CAPTURE(df);
        CHECK(chi_square_critical_value(0.05, df) == doctest::Approx(table[df - 1]).epsilon(0.0005 / table[df - 1]));
    }
}

TEST_CASE("critical values to full precision") {
    // Source: SciPy 1.10, scipy.stats.chi2.isf(alpha, df), run on Debian 12.
    CHECK(chi_square_critical_value(0.05, 1) == doctest::Approx(3.84145882).epsilon(1e-8));
    CHECK(chi_square_critical_value(0.01, 3) == doctest::Approx(11.344866730144368).epsilon(1e-12));
}

TEST_CASE("closed forms of the upper tail") {
    // Closed forms (common practice): df 2: Q = exp(-x/2); df 4: Q = exp(-x/2)(1 + x/2).
    for (double x : {0.1, 1.0, 3.5, 10.0, 60.0, 500.0}) {
        CAPTURE(x);
        CHECK(chi_square_upper_tail(x, 2).p == doctest::Approx(std::exp(-x / 2)).epsilon(1e-14));
        CHECK(chi_square_upper_tail(x, 4).p == doctest::Approx(std::exp(-x / 2) * (1 + x / 2)).epsilon(1e-14));
        CHECK(chi_square_upper_tail(x, 2).log10_p == doctest::Approx(-x / 2 / std::log(10.0)).epsilon(1e-14));
    }
}

TEST_CASE("upper tail below the double range keeps its logarithm") {
    // Closed form, df 2: log10 Q = -x / (2 ln 10); at x = 2000 that is -434.29..., far below 1e-308.
    const TailProbability t = chi_square_upper_tail(2000, 2);
    CHECK(t.p == 0.0);
    CHECK(t.log10_p == doctest::Approx(-1000 / std::log(10.0)).epsilon(1e-12));
}

TEST_CASE("lower tail is the complement, computed directly") {
    // Closed form, df 2: P = 1 - exp(-x/2) = -expm1(-x/2); a tiny x shows that no 1 - Q is taken.
    CHECK(chi_square_lower_tail(1e-10, 2).p == doctest::Approx(-std::expm1(-0.5e-10)).epsilon(1e-12));
    CHECK(chi_square_lower_tail(3, 2).p == doctest::Approx(-std::expm1(-1.5)).epsilon(1e-14));
}

TEST_CASE("density") {
    // Closed form, df 2: f(x) = exp(-x/2) / 2.
    CHECK(chi_square_density(3, 2) == doctest::Approx(std::exp(-1.5) / 2).epsilon(1e-14));
    CHECK(chi_square_density(-1, 3) == 0.0);
}

TEST_CASE("bad arguments give NaN, never a number that looks valid") {
    CHECK(std::isnan(chi_square_upper_tail(1, 0).p));
    CHECK(std::isnan(chi_square_upper_tail(1, -2).p));
    CHECK(std::isnan(chi_square_critical_value(0, 3)));
    CHECK(std::isnan(chi_square_critical_value(1, 3)));
    CHECK(std::isnan(chi_square_density(1, 0)));
}
