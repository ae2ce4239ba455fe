// The lower tail (a fit too good to be true), the noncentrality-based effect size and results that
// must stay bounded or absent: against R 4.2 pchisq(log.p = TRUE), mpmath 1.3 and brute-force
// enumeration written out here.
#include <doctest/doctest.h>

#include <cmath>
#include <functional>
#include <vector>

#include "binomial_test.hpp"
#include "effect_size.hpp"
#include "exact_lower_tail.hpp"
#include "goodness_of_fit.hpp"

using namespace tallyproof;

namespace {

Analysis equal_counts(std::vector<double> observed) {
    Analysis a;
    for (std::size_t i = 0; i < observed.size(); ++i) a.categories.push_back("c" + std::to_string(i));
    a.observed = std::move(observed);
    return a;
}

// P(X2 <= x2_obs) summed over every outcome by brute force: nested counts, multinomial pmf from
// lgamma, Pearson X2 written out (no code shared with core/exact/exact_lower_tail).
double brute_force_lower(const std::vector<double>& observed, const std::vector<double>& shares) {
    const std::size_t k = observed.size();
    double n = 0, x2_obs = 0;
    for (double o : observed) n += o;
    for (std::size_t j = 0; j < k; ++j) x2_obs += (observed[j] - n * shares[j]) * (observed[j] - n * shares[j]) / (n * shares[j]);
    std::vector<double> x(k);
    double total = 0;
    std::function<void(std::size_t, double)> walk = [&](std::size_t j, double left) {
        if (j + 1 == k) {
            x[j] = left;
            double x2 = 0, log_p = std::lgamma(n + 1);
            for (std::size_t i = 0; i < k; ++i) {
                x2 += (x[i] - n * shares[i]) * (x[i] - n * shares[i]) / (n * shares[i]);
                log_p += x[i] * std::log(shares[i]) - std::lgamma(x[i] + 1);
            }
            if (x2 <= x2_obs * (1 + 1e-9) + 1e-12) total += std::exp(log_p);
            return;
        }
        for (double v = 0; v <= left; ++v) {
            x[j] = v;
            walk(j + 1, left - v);
        }
    };
    walk(0, n);
    return total;
}

}  // namespace

TEST_CASE("log10 of the lower tail below the double range") {
    // R 4.2.2: pchisq(0.02, 300, log.p = TRUE) / log(10) = -562.761207593581;
    // mpmath 1.3 (50 digits): log10(gammainc(150, 0, 0.01, regularized=True)) = -562.76120759358123557.
    const TailProbability t = chi_square_lower_tail(0.02, 300);
    CHECK(t.log10_p == doctest::Approx(-562.76120759358123557).epsilon(1e-13));
    // The analysis carries it: 301 equal categories of 100 with one +1 and one -1 give X2 = 0.02.
    std::vector<double> counts(301, 100);
    counts[0] = 101;
    counts[1] = 99;
    const Result r = analyse(equal_counts(counts));
    REQUIRE(r.status.ok);
    CHECK(r.statistic == doctest::Approx(0.02).epsilon(1e-12));
    CHECK(r.lower.p == 0);  // below the double range: only the logarithm holds it
    CHECK(r.lower.log10_p == doctest::Approx(-562.76120759358123557).epsilon(1e-13));
    CHECK_FALSE(r.exact_lower_computed);  // C(500, 300) outcomes: asymptotic, and said so
    bool warned = false;
    for (const auto& w : r.warnings) warned = warned || w.find("asymptotic lower-tail p = 1.7 × 10⁻⁵⁶³") != std::string::npos;
    CHECK(warned);
}

TEST_CASE("exact lower tail against brute force") {
    // Closed form: [5, 5, 5] under equal shares is the only outcome with X2 = 0, so
    // P = 15! / (5!^3 3^15) = 756756 / 14348907.
    TailProbability t;
    REQUIRE(exact_lower_tail({5, 5, 5}, {5, 5, 5}, 1.0, &t).ok);
    CHECK(t.p == doctest::Approx(756756.0 / 14348907.0).epsilon(1e-12));
    CHECK(t.p == doctest::Approx(brute_force_lower({5, 5, 5}, {1.0 / 3, 1.0 / 3, 1.0 / 3})).epsilon(1e-12));
    struct Case { std::vector<double> observed, shares; };
    const Case cases[] = {
        {{4, 6, 5}, {1.0 / 3, 1.0 / 3, 1.0 / 3}},
        {{9, 3, 3, 1}, {9.0 / 16, 3.0 / 16, 3.0 / 16, 1.0 / 16}},
        {{2, 7, 1, 0, 5}, {0.1, 0.3, 0.2, 0.15, 0.25}},
        {{12, 0}, {0.5, 0.5}},
        {{3, 3, 3, 3, 3, 3}, {1.0 / 6, 1.0 / 6, 1.0 / 6, 1.0 / 6, 1.0 / 6, 1.0 / 6}},
    };
    for (const auto& c : cases) {
        double n = 0;
        for (double o : c.observed) n += o;
        std::vector<double> expected;
        for (double s : c.shares) expected.push_back(n * s);
        REQUIRE(exact_lower_tail(c.observed, expected, 1.0, &t).ok);
        CHECK(t.p == doctest::Approx(brute_force_lower(c.observed, c.shares)).epsilon(1e-11));
        CHECK(t.log10_p == doctest::Approx(std::log10(t.p)).epsilon(1e-12));
    }
    // Too many outcomes: refused, so the caller says "asymptotic".
    CHECK_FALSE(exact_lower_tail(std::vector<double>(20, 50), std::vector<double>(20, 50), 1.0, &t).ok);
}

TEST_CASE("a perfect fit at small N is not called too good") {
    const Result r = analyse(equal_counts({5, 5, 5}));
    REQUIRE(r.status.ok);
    REQUIRE(r.exact_lower_computed);
    CHECK(r.exact_lower.p == doctest::Approx(756756.0 / 14348907.0).epsilon(1e-12));
    for (const auto& w : r.warnings) CHECK(w.find("closer to the stated mix") == std::string::npos);
}

TEST_CASE("property: the labelled effect size lies inside its interval") {
    // Over a grid of k, N and X2 (from well below df to far above): sqrt(max(0, X2 - df) / N) is
    // inside the noncentrality interval, and a statistic at or below df is never above "very small".
    int checked = 0;
    for (double k : {2.0, 3.0, 5.0, 10.0, 30.0, 100.0, 1000.0}) {
        const double df = k - 1;
        for (double n : {10.0, 100.0, 1e4, 1e6}) {
            for (double ratio : {0.0, 0.01, 0.3, 0.9, 1.0, 1.1, 2.0, 5.0, 50.0, 1e3}) {
                const double x2 = ratio * df;
                EffectSizeInterval iv;
                REQUIRE(cohens_w_interval(x2, n, df, 0.95, &iv).ok);
                const double est = noncentral_w(x2, n, df);
                CHECK(est >= iv.lower * (1 - 1e-9));
                CHECK(est <= iv.upper * (1 + 1e-9) + 1e-300);
                if (x2 <= df) CHECK(est == 0);
                ++checked;
            }
        }
    }
    CHECK(checked == 280);
    // The case: k = 1000, N = 10,000 null-like data: Cohen's w ~ 0.32 ("medium"), the
    // estimate 0 inside [0, upper].
    CHECK(cohens_w(999, 10000) > 0.3);
    CHECK(noncentral_w(999, 10000, 999) == 0);
}

TEST_CASE("binomial test bounded near 2^53") {
    // Closed form: [9e15, 0] against 1/2 is 2^-9e15 twice, far below the double range:
    // log10 p = log10(2) - 9e15 log10(2).
    const TailProbability a = binomial_test_two_sided(9e15, 9e15, 0.5);
    CHECK(a.log10_p == doctest::Approx(std::log10(2.0) * (1 - 9e15)).epsilon(1e-12));
    const TailProbability b = binomial_test_two_sided(9007199254740991.0, 9007199254740992.0, 0.5);
    CHECK(b.log10_p < -1e15);
    const TailProbability c = binomial_test_two_sided(4503599627370496.0, 9007199254740992.0, 0.5);  // the mean
    CHECK(c.p == 1.0);
}

TEST_CASE("at alpha = 1e-17 Goodman's intervals hold and Sison-Glaz's are absent with the reason") {
    Analysis a = equal_counts({30, 50, 20});
    a.alpha = 1e-17;  // 1 - alpha is 1 in double precision: Goodman's come from alpha itself
    const Result r = analyse(a);
    REQUIRE(r.status.ok);
    REQUIRE(r.diagnostics.categories.size() == 3);
    for (const auto& d : r.diagnostics.categories) {
        CHECK(d.goodman.lower < d.observed_share);
        CHECK(d.goodman.upper > d.observed_share);
        CHECK(std::isnan(d.sison_glaz.lower));
    }
    bool said = false;
    for (const auto& w : r.warnings) said = said || w.find("Sison-Glaz intervals are not available") != std::string::npos;
    CHECK(said);
}
