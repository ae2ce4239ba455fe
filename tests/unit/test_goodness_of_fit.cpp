// Pearson goodness-of-fit on equal shares against R and SciPy.
#include <doctest/doctest.h>

#include <cmath>

#include "goodness_of_fit.hpp"

using namespace tallyproof;

namespace {
Analysis equal_shares(std::vector<double> observed) {
    Analysis a;
    for (std::size_t i = 0; i < observed.size(); ++i) a.categories.push_back("c" + std::to_string(i + 1));
    a.observed = std::move(observed);
    return a;
}
}  // namespace

TEST_CASE("four categories, equal shares") {
    // Source: R 4.2 chisq.test(c(18,25,31,26)): X-squared = 3.44, df = 3, p-value = 0.32862769938219899;
    // SciPy 1.10 scipy.stats.chisquare([18,25,31,26]) gives the same statistic and p = 0.3286276993821981.
    const Result r = analyse(equal_shares({18, 25, 31, 26}));
    REQUIRE(r.status.ok);
    CHECK(r.n == 100);
    CHECK(r.df == 3);
    CHECK(r.statistic == doctest::Approx(3.44).epsilon(1e-14));
    CHECK(r.upper.p == doctest::Approx(0.32862769938219899).epsilon(1e-13));
    CHECK_FALSE(r.reject);
    for (double e : r.expected_counts) CHECK(e == 25);
    double sum = 0;
    for (double c : r.contributions) sum += c;
    CHECK(sum == doctest::Approx(r.statistic).epsilon(1e-14));
}

TEST_CASE("six categories, a clear departure") {
    // Source: SciPy 1.10 scipy.stats.chisquare([30,14,34,45,57,20]): statistic 37.78, p = 4.177325475265192e-07.
    const Result r = analyse(equal_shares({30, 14, 34, 45, 57, 20}));
    REQUIRE(r.status.ok);
    CHECK(r.statistic == doctest::Approx(37.78).epsilon(1e-13));
    CHECK(r.df == 5);
    CHECK(r.upper.p == doctest::Approx(4.177325475265192e-07).epsilon(1e-12));
    CHECK(r.reject);
    // Pearson residual (O - E)/sqrt(E) with E = 200/6 (definition, Pearson 1900).
    CHECK(r.diagnostics.categories[4].pearson_residual == doctest::Approx((57 - 200.0 / 6) / std::sqrt(200.0 / 6)).epsilon(1e-14));
}

TEST_CASE("refusals name the problem") {
    CHECK_FALSE(analyse(equal_shares({})).status.ok);
    const Result one = analyse(equal_shares({12}));
    CHECK_FALSE(one.status.ok);
    CHECK(one.status.message.find("at least two") != std::string::npos);
    const Result zero = analyse(equal_shares({0, 0, 0}));
    CHECK_FALSE(zero.status.ok);
    CHECK(zero.status.message.find("zero") != std::string::npos);
    CHECK_FALSE(analyse(equal_shares({3, -1})).status.ok);
    CHECK_FALSE(analyse(equal_shares({3, 1.5})).status.ok);
}

TEST_CASE("stated counts that differ from N by rounding are rescaled, larger gaps refused") {
    Analysis a = equal_shares({10, 20, 30});
    a.model.kind = ModelKind::counts;
    a.model.values = {20.1, 19.9, 20.3};  // total 60.3 against 60: rounding
    Result r = analyse(a);
    REQUIRE(r.status.ok);
    CHECK(r.expected_counts[0] == doctest::Approx(60 * 20.1 / 60.3));
    CHECK(r.warnings.size() >= 1);
    a.model.values = {30, 30, 30};
    r = analyse(a);
    CHECK_FALSE(r.status.ok);
    CHECK(r.status.message.find("90") != std::string::npos);
    CHECK(r.status.message.find("60") != std::string::npos);
}

TEST_CASE("a fit closer than chance allows is pointed out") {
    // Source: SciPy 1.10, chisquare([100,100,100,101]) -> statistic 0.0074812967581047385, and
    // chi2.cdf(0.0074812967581047385, 3) = 0.00017171554497201163 (the lower tail).
    const Result r = analyse(equal_shares({100, 100, 100, 101}));
    REQUIRE(r.status.ok);
    CHECK(r.statistic == doctest::Approx(0.0074812967581047385).epsilon(1e-13));
    CHECK(r.lower.p == doctest::Approx(0.00017171554497201163).epsilon(1e-10));
    bool warned = false;
    for (const auto& w : r.warnings) warned = warned || w.find("closer to the stated mix than chance") != std::string::npos;
    CHECK(warned);
    // An ordinary fit gets no such note (R 4.2: chisq.test(c(18,25,31,26)) lower tail 0.67).
    const Result ordinary = analyse(equal_shares({18, 25, 31, 26}));
    for (const auto& w : ordinary.warnings) CHECK(w.find("closer to the stated mix") == std::string::npos);
}
