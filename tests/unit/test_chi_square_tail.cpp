// Chi-square tails, density and critical values against published tables and closed forms.
#include <doctest/doctest.h>

#include <cmath>
#include <initializer_list>

#include <limits>

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

// ---- Reference grid (tests/reference/chi_square_tails.csv, mpmath 1.2.1 at 50 digits) ----
#include <algorithm>
#include <cstdio>
#include <cstdlib>
#include <fstream>
#include <sstream>
#include <string>
#include <vector>

namespace {

struct TailRow {
    double df, x, log10_upper, log10_lower, upper, lower;
};

std::vector<TailRow> read_tail_grid() {
    std::vector<TailRow> rows;
    std::ifstream in(std::string(TALLYPROOF_REFERENCE_DIR) + "/chi_square_tails.csv");
    std::string line;
    while (std::getline(in, line)) {
        if (line.empty() || line[0] == '#' || line[0] == 'd') continue;
        std::stringstream ss(line);
        std::string cell[6];
        for (auto& c : cell) std::getline(ss, c, ',');
        // strtod rounds the 20-digit strings correctly; values below the double range become 0
        rows.push_back({std::strtod(cell[0].c_str(), nullptr), std::strtod(cell[1].c_str(), nullptr),
                        std::strtod(cell[2].c_str(), nullptr), std::strtod(cell[3].c_str(), nullptr),
                        std::strtod(cell[4].c_str(), nullptr), std::strtod(cell[5].c_str(), nullptr)});
    }
    return rows;
}

// The tolerances stated in the CSV header: 1e-14 relative for p wherever p is a normal double,
// and for log10 p beyond.
constexpr double kTolerance = 1e-14;

void check_tail(const std::string& which, const TailRow& r, const TailProbability& got, double p_ref,
                double log10_ref) {
    CAPTURE(which);
    CAPTURE(r.df);
    CAPTURE(r.x);
    if (p_ref >= std::numeric_limits<double>::min()) {
        const double rel = std::fabs(got.p - p_ref) / p_ref;
        CAPTURE(rel);
        CHECK(rel <= kTolerance);
    } else {
        CHECK(std::isfinite(got.log10_p));
        CHECK(std::fabs(got.log10_p - log10_ref) <= kTolerance * std::fabs(log10_ref));
    }
    // log10 of a tail near 1 is tiny, log1p of minus the other tail: it must keep relative
    // precision too.
    if (std::fabs(log10_ref) > 1e-300) {
        CHECK(std::fabs(got.log10_p - log10_ref) <= kTolerance * std::fabs(log10_ref));
    }
}

}  // namespace

TEST_CASE("every row of the 50-digit mpmath grid, both tails") {
    const std::vector<TailRow> rows = read_tail_grid();
    REQUIRE(rows.size() == 868);  // the generator writes 868 rows
    int normal = 0, just_above_underflow = 0;
    for (const TailRow& r : rows) {
        check_tail("upper", r, chi_square_upper_tail(r.x, r.df), r.upper, r.log10_upper);
        check_tail("lower", r, chi_square_lower_tail(r.x, r.df), r.lower, r.log10_lower);
        for (double p : {r.upper, r.lower}) {
            if (p >= std::numeric_limits<double>::min()) ++normal;
            if (p >= std::numeric_limits<double>::min() && p < 1e-300) ++just_above_underflow;
        }
    }
    // the grid reaches the bottom of the normal range (log10 p down to -307.6) in both tails
    CHECK(normal > 1500);
    CHECK(just_above_underflow >= 60);
}

TEST_CASE("far upper tail: log10 p is finite and p is never reported as 0 in log form") {
    // Reference row df = 1e6, x = 1e7 of tests/reference/chi_square_tails.csv (mpmath, 50 digits).
    const TailProbability t = chi_square_upper_tail(1e7, 1e6);
    CHECK(t.p == 0.0);
    CHECK(t.log10_p == doctest::Approx(-1.4543293713822586264e+6).epsilon(1e-13));
    // Closed form, df 2: log10 Q = -x / (2 ln 10), at x = 1e7.
    CHECK(chi_square_upper_tail(1e7, 2).log10_p == doctest::Approx(-5e6 / std::log(10.0)).epsilon(1e-14));
}

TEST_CASE("lower tail far below the double range: a fit too good to be true") {
    // Closed form, df 2: P = 1 - exp(-x/2), log10 P = log10(-expm1(-x/2)) ~ log10(x/2) for tiny x.
    const TailProbability t = chi_square_lower_tail(1e-300, 2);
    CHECK(t.log10_p == doctest::Approx(std::log10(0.5e-300)).epsilon(1e-14));
    // Reference row df = 1e6, x = 0.01 of tests/reference/chi_square_tails.csv (mpmath, 50 digits).
    const TailProbability deep = chi_square_lower_tail(0.01, 1e6);
    CHECK(deep.p == 0.0);
    CHECK(deep.log10_p == doctest::Approx(-3.7828560097948508777e+6).epsilon(1e-13));
}

TEST_CASE("critical values at tiny alpha, also given as log10 alpha") {
    // Source: SciPy 1.10 scipy.stats.chi2.isf(1e-300, 3) = 1388.3367738546858 and
    // chi2.isf(1e-10, 1e6) = 1009022.6223853256, run on Debian 12.
    CHECK(chi_square_critical_value(1e-300, 3) == doctest::Approx(1388.3367738546858).epsilon(1e-12));
    CHECK(chi_square_critical_value_log10(-10, 1e6) == doctest::Approx(1009022.6223853256).epsilon(1e-12));
    // Source: mpmath 1.2.1 at 50 digits, findroot of log10(gammainc(df/2, x/2, inf, regularized=True))
    // = log10_alpha, started at z0 = -L ln 10 + (df/2 - 1) ln(-L ln 10); values to 20 digits.
    CHECK(chi_square_critical_value_log10(-5000, 1) == doctest::Approx(23015.355343450320259).epsilon(1e-13));
    CHECK(chi_square_critical_value_log10(-5000, 10) == doctest::Approx(23094.329076680891712).epsilon(1e-13));
    CHECK(chi_square_critical_value_log10(-400, 3) == doctest::Approx(1849.1400483690717895).epsilon(1e-13));
    CHECK(chi_square_critical_value_log10(-1e5, 1000) == doctest::Approx(467644.38277798590379).epsilon(1e-13));
    // Round trip (common practice): the tail at the critical value is alpha again.
    for (double L : {-1.0, -300.0, -301.0, -1e4, -1e6}) {
        for (double df : {0.5, 1.0, 7.0, 1e3, 1e6}) {
            CAPTURE(L);
            CAPTURE(df);
            const double x = chi_square_critical_value_log10(L, df);
            REQUIRE(std::isfinite(x));
            CHECK(chi_square_upper_tail(x, df).log10_p == doctest::Approx(L).epsilon(1e-12));
        }
    }
    CHECK(chi_square_critical_value_log10(0, 4) == 0.0);
}

TEST_CASE("bad arguments to the extended functions give NaN") {
    CHECK(std::isnan(chi_square_critical_value_log10(0.5, 3)));  // log10 alpha > 0: alpha > 1
    CHECK(std::isnan(chi_square_critical_value_log10(-2, 0)));
    CHECK(std::isnan(chi_square_critical_value_log10(-std::numeric_limits<double>::infinity(), 3)));
    CHECK(std::isnan(chi_square_critical_value_log10(std::nan(""), 3)));
    CHECK(std::isnan(chi_square_upper_tail(std::nan(""), 3).log10_p));
    CHECK(std::isnan(chi_square_lower_tail(1, std::numeric_limits<double>::infinity()).p));
    CHECK(std::isnan(chi_square_lower_tail(1, -1).log10_p));
    // x = +inf is a valid statistic: the upper tail is 0 exactly, the lower 1.
    CHECK(chi_square_upper_tail(std::numeric_limits<double>::infinity(), 3).p == 0.0);
    CHECK(chi_square_lower_tail(std::numeric_limits<double>::infinity(), 3).p == 1.0);
}
