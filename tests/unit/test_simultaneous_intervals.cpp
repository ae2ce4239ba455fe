// Simultaneous intervals for multinomial proportions. Goodman (1965) against SciPy 1.10;
// Sison-Glaz (1995) against OUR OWN independent Python re-implementation of the paper (mpmath,
// factorial-moment form; tests/reference/generate_simultaneous_intervals.py), not a published
// library. Closed forms and bad arguments below.
#include <doctest/doctest.h>

#include "reference_csv.hpp"

#include <cmath>
#include <cstdint>
#include <cstdlib>
#include <fstream>
#include <limits>
#include <map>
#include <sstream>

#include "simultaneous_intervals.hpp"

using namespace tallyproof;

namespace {

struct IntervalRow {
    std::string name;
    double confidence, count, g_lo, g_hi, sg_lo, sg_hi, c, gamma, nu_c, nu_c1, exact_nu_c;
};

std::vector<IntervalRow> read_interval_csv() {
    std::vector<IntervalRow> rows;
    for (auto f : tallyproof_test::reference_rows("simultaneous_intervals.csv")) {
        if (f.size() == 12) f.push_back("");  // trailing empty exact_nu_c
        auto num = [&](std::size_t i) { return f[i].empty() ? NAN : std::strtod(f[i].c_str(), nullptr); };
        rows.push_back({f[0], num(1), num(3), num(4), num(5), num(6), num(7), num(8), num(9), num(10), num(11), num(12)});
    }
    return rows;
}

}  // namespace

TEST_CASE("Goodman and Sison-Glaz against the Python reference") {
    const auto rows = read_interval_csv();
    REQUIRE(rows.size() >= 50);
    std::vector<std::string> order;
    std::map<std::string, std::vector<IntervalRow>> cases;
    for (const auto& r : rows) {
        if (!cases.count(r.name)) order.push_back(r.name);
        cases[r.name].push_back(r);
    }
    for (const auto& name : order) {
        const auto& g = cases[name];
        CAPTURE(name);
        std::vector<double> x;
        for (const auto& r : g) x.push_back(r.count);
        const double conf = g[0].confidence;
        std::vector<ProportionInterval> good, sg;
        SisonGlazDetail d;
        REQUIRE(goodman_intervals(x, conf, &good).ok);
        REQUIRE(sison_glaz_intervals(x, conf, &sg, &d).ok);
        REQUIRE(good.size() == x.size());
        REQUIRE(sg.size() == x.size());
        CHECK(d.c == g[0].c);  // SG's c must agree exactly
        CHECK(d.gamma == doctest::Approx(g[0].gamma).epsilon(1e-9));
        CHECK(d.coverage_c == doctest::Approx(g[0].nu_c).epsilon(1e-11));
        CHECK(d.coverage_c_plus_1 == doctest::Approx(g[0].nu_c1).epsilon(1e-11));
        for (std::size_t i = 0; i < x.size(); ++i) {
            CAPTURE(i);
            CHECK(good[i].lower == doctest::Approx(g[i].g_lo).epsilon(1e-12));  // SciPy 1.10
            CHECK(good[i].upper == doctest::Approx(g[i].g_hi).epsilon(1e-12));
            CHECK(std::fabs(sg[i].lower - g[i].sg_lo) < 1e-12);  // own Python re-implementation
            CHECK(std::fabs(sg[i].upper - g[i].sg_hi) < 1e-11);
        }
        // Not a check of our code but of the expansion it transcribes: the Edgeworth nu(c) is
        // within 0.01 of the exact coverage (exact by convolution in the generator).
        if (!std::isnan(g[0].exact_nu_c)) CHECK(std::fabs(d.coverage_c - g[0].exact_nu_c) < 0.01);
    }
}

TEST_CASE("Goodman closed form with two equal cells") {
    // Closed form: x = (50, 50), n = 100, confidence 0.95 -> A = chi2 upper 0.025 point of
    // chi2(1) = z_{0.0125}^2; bounds (A + 100 -+ sqrt(A (A + 100))) / (2 (100 + A)).
    std::vector<ProportionInterval> g;
    REQUIRE(goodman_intervals({50, 50}, 0.95, &g).ok);
    const double a = 5.0238861873148881;  // SciPy 1.10: scipy.stats.chi2.isf(0.025, 1)
    CHECK(g[0].lower == doctest::Approx((a + 100 - std::sqrt(a * (a + 100))) / (2 * (100 + a))).epsilon(1e-12));
    CHECK(g[1].upper == doctest::Approx((a + 100 + std::sqrt(a * (a + 100))) / (2 * (100 + a))).epsilon(1e-12));
}

TEST_CASE("Sison-Glaz coverage at c = 0 is the exact multinomial probability") {
    // Closed form: x = (1, 1), p = (1/2, 1/2): P(X = (1, 1)) = 2 * 1/4 = 1/2.
    CHECK(sison_glaz_coverage({1, 1}, 0) == doctest::Approx(0.5).epsilon(1e-14));
    // x = (2, 1), p = (2/3, 1/3): 3 * (2/3)^2 * (1/3) = 4/9.
    CHECK(sison_glaz_coverage({2, 1}, 0) == doctest::Approx(4.0 / 9).epsilon(1e-14));
}

TEST_CASE("Sison-Glaz intervals: properties") {
    const std::vector<double> x{8, 12, 9, 15, 4, 12};
    std::vector<ProportionInterval> sg;
    SisonGlazDetail d;
    REQUIRE(sison_glaz_intervals(x, 0.95, &sg, &d).ok);
    CHECK(d.coverage_c < 0.95);
    CHECK(d.coverage_c_plus_1 > 0.95);
    CHECK(d.gamma >= 0);
    CHECK(d.gamma <= 1);
    for (std::size_t i = 0; i < x.size(); ++i) {
        CHECK(sg[i].lower <= x[i] / 60);
        CHECK(sg[i].upper >= x[i] / 60);
        // unclamped bounds: width (2c + 2 gamma) / n, the same for every category
        if (sg[i].lower > 0) CHECK(sg[i].upper - sg[i].lower == doctest::Approx((2 * d.c + 2 * d.gamma) / 60));
    }
    // coverage grows with c
    CHECK(sison_glaz_coverage(x, 3) < sison_glaz_coverage(x, 5));
    CHECK(sison_glaz_coverage(x, 5) < sison_glaz_coverage(x, 9));
}

TEST_CASE("the bisection past c = 64 finds the same c as the paper's linear scan") {
    // Linear scan written out here with sison_glaz_coverage, over generated counts.
    std::uint64_t state = 99;
    auto next = [&]() {
        state = state * 6364136223846793005ULL + 1442695040888963407ULL;
        return static_cast<double>(state >> 11) / 9007199254740992.0;
    };
    for (int trial = 0; trial < 12; ++trial) {
        const std::size_t k = 2 + static_cast<std::size_t>(next() * 8);
        std::vector<double> x(k);
        for (auto& v : x) v = std::floor(next() * next() * 3000);
        x[0] += 1;
        const double conf = trial % 3 == 0 ? 0.99 : 0.95;
        CAPTURE(trial);
        double n = 0;
        for (double v : x) n += v;
        double c = 1;
        while (c <= n && !(sison_glaz_coverage(x, c) > conf)) ++c;
        std::vector<ProportionInterval> sg;
        SisonGlazDetail d;
        REQUIRE(sison_glaz_intervals(x, conf, &sg, &d).ok);
        CHECK(d.c == c - 1);
        CHECK(d.coverage_c_plus_1 == sison_glaz_coverage(x, c));
    }
}

TEST_CASE("one observation carries all the coverage") {
    std::vector<ProportionInterval> sg;
    SisonGlazDetail d;
    REQUIRE(sison_glaz_intervals({1, 0}, 0.95, &sg, &d).ok);  // closed form: P(X = (1, 0) | p = (1, 0)) = 1
    CHECK(d.coverage_c == 1.0);
    CHECK(sg[0].lower == 1.0);
    CHECK(sg[1].upper == 0.0);
}

TEST_CASE("Sison-Glaz for a large total") {
    // n = 10^8: the moments about lambda must not cancel (factorial moments would lose every
    // digit here); the intervals must still hold the observed shares and be narrow.
    std::vector<ProportionInterval> sg;
    SisonGlazDetail d;
    REQUIRE(sison_glaz_intervals({12000000, 8000000, 30000000, 50000000}, 0.95, &sg, &d).ok);
    CHECK(d.coverage_c < 0.95);
    CHECK(d.coverage_c_plus_1 > 0.95);
    CHECK(sg[3].lower < 0.5);
    CHECK(sg[3].upper > 0.5);
    CHECK(sg[3].upper - sg[3].lower < 1e-3);
}

TEST_CASE("bad arguments are refused") {
    std::vector<ProportionInterval> v;
    const double nan = std::numeric_limits<double>::quiet_NaN();
    CHECK_FALSE(goodman_intervals({5}, 0.95, &v).ok);
    CHECK_FALSE(goodman_intervals({0, 0}, 0.95, &v).ok);
    CHECK_FALSE(goodman_intervals({1, 2.5}, 0.95, &v).ok);
    CHECK_FALSE(goodman_intervals({1, -2}, 0.95, &v).ok);
    CHECK_FALSE(goodman_intervals({1, nan}, 0.95, &v).ok);
    CHECK_FALSE(goodman_intervals({1, 2}, 0, &v).ok);
    CHECK_FALSE(goodman_intervals({1, 2}, 1, &v).ok);
    CHECK_FALSE(goodman_intervals({1, 2}, nan, &v).ok);
    Status s = sison_glaz_intervals({3, 4.5}, 0.95, &v);
    CHECK_FALSE(s.ok);
    CHECK(s.message.find("category 2") != std::string::npos);
    CHECK_FALSE(sison_glaz_intervals({3}, 0.95, &v).ok);
    CHECK_FALSE(sison_glaz_intervals({3, 4}, 1.5, &v).ok);
    CHECK(v.empty());
    CHECK(std::isnan(sison_glaz_coverage({3, 4}, -1)));
    CHECK(std::isnan(sison_glaz_coverage({3, 4}, 1.5)));
    CHECK(std::isnan(sison_glaz_coverage({0, 0}, 1)));
}
