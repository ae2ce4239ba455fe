// Exact multinomial p-values against a brute-force enumeration written here, a SciPy
// enumeration (tests/reference/exact_multinomial.csv), closed forms, slicing and refusals.
#include <doctest/doctest.h>

#include "reference_csv.hpp"

#include <cmath>
#include <fstream>
#include <functional>
#include <sstream>
#include <string>
#include <vector>

#include "exact_multinomial.hpp"

using namespace tallyproof;
using tallyproof_test::split_numbers;

namespace {

// Independent oracle: every outcome enumerated; probability from lgamma; the statistic from the
// defining (uncentred) Cressie-Read formula with its limits; ties as documented (1e-9 relative).
double brute_force_p(const std::vector<int>& obs, const std::vector<double>& pi, ExtremeOrdering ordering,
                     double lambda) {
    const int k = static_cast<int>(obs.size());
    int n = 0;
    for (int v : obs) n += v;
    auto log_prob = [&](const std::vector<int>& x) {
        double s = std::lgamma(n + 1.0);
        for (int i = 0; i < k; ++i) s += -std::lgamma(x[i] + 1.0) + (x[i] ? x[i] * std::log(pi[i]) : 0.0);
        return s;
    };
    auto stat = [&](const std::vector<int>& x) {
        double s = 0;
        for (int i = 0; i < k; ++i) {
            const double o = x[i], e = n * pi[i];
            if (lambda == 0) s += o > 0 ? 2 * o * std::log(o / e) : 0.0;
            else s += 2 / (lambda * (lambda + 1)) * ((o > 0 ? std::pow(o, lambda + 1) * std::pow(e, -lambda) : 0.0) - o);
        }
        return s;
    };
    const double lp_obs = log_prob(obs), t_obs = stat(obs);
    double p = 0;
    std::vector<int> x(k);
    std::function<void(int, int)> rec = [&](int j, int m) {
        if (j == k - 1) {
            x[j] = m;
            const bool extreme = ordering == ExtremeOrdering::probability ? log_prob(x) <= lp_obs + 1e-9
                                                                          : stat(x) >= t_obs - 1e-9 * std::fabs(t_obs);
            if (extreme) p += std::exp(log_prob(x));
            return;
        }
        for (int v = 0; v <= m; ++v) {
            x[j] = v;
            rec(j + 1, m - v);
        }
    };
    rec(0, n);
    return p;
}

MultinomialTestSpec spec_of(const std::vector<int>& obs, const std::vector<double>& pi, ExtremeOrdering ordering,
                            double lambda) {
    MultinomialTestSpec s;
    for (int v : obs) s.observed.push_back(v);
    s.null_shares = pi;
    s.ordering = ordering;
    s.lambda = lambda;
    return s;
}

ExactMultinomialResult exact(const MultinomialTestSpec& spec) {
    ExactMultinomialResult r;
    const Status s = exact_multinomial_p_value(spec, ExactMultinomialOptions{}, &r);
    REQUIRE_MESSAGE(s.ok, s.message);
    return r;
}

}  // namespace

TEST_CASE("small cases agree with brute-force enumeration") {
    const std::vector<std::vector<double>> nulls = {
        {0.5, 0.5}, {0.9, 0.1}, {0.2, 0.3, 0.5}, {1 / 3.0, 1 / 3.0, 1 / 3.0},
        {0.25, 0.25, 0.25, 0.25}, {0.4, 0.3, 0.2, 0.1}, {0.05, 0.05, 0.1, 0.8}};
    const std::vector<std::vector<int>> tables = {
        {7, 1}, {3, 9}, {0, 20}, {3, 5, 2}, {12, 3, 5}, {0, 0, 7}, {6, 6, 6}, {10, 2, 1, 0},
        {4, 4, 4, 4}, {1, 2, 3, 14}, {0, 5, 0, 15}, {2, 2, 2, 2}};
    int compared = 0;
    for (const auto& pi : nulls)
        for (const auto& obs : tables) {
            if (obs.size() != pi.size()) continue;
            for (int o = 0; o < 2; ++o)
                for (double lambda : {1.0, 0.0, 2.0 / 3, -0.5, 2.5}) {
                    const auto ordering = o ? ExtremeOrdering::probability : ExtremeOrdering::statistic;
                    if (o && lambda != 1.0) continue;
                    CAPTURE(obs.size());
                    CAPTURE(obs[0]);
                    CAPTURE(obs[1]);
                    CAPTURE(pi[0]);
                    CAPTURE(o);
                    CAPTURE(lambda);
                    const ExactMultinomialResult r = exact(spec_of(obs, pi, ordering, lambda));
                    const double want = brute_force_p(obs, pi, ordering, lambda);
                    // The oracle itself carries ~n * 1e-16 rounding; our stated bound must cover ours.
                    CHECK(r.p.p == doctest::Approx(want).epsilon(1e-13));
                    CHECK(std::fabs(r.p.p - want) <= r.error_bound + 1e-14 * want);
                    CHECK(r.relative_error_bound < 1e-10);
                    ++compared;
                }
        }
    CHECK(compared > 100);
}

TEST_CASE("agrees with a SciPy enumeration (tests/reference/exact_multinomial.csv)") {
    std::ifstream in(TALLYPROOF_REFERENCE_DIR "/exact_multinomial.csv");
    REQUIRE(in.good());
    std::string line;
    int rows = 0;
    while (std::getline(in, line)) {
        if (line.empty() || line[0] == '#') continue;
        std::stringstream ss(line);
        std::string ord, lam, o, pi, p;
        std::getline(ss, ord, ',');
        std::getline(ss, lam, ',');
        std::getline(ss, o, ',');
        std::getline(ss, pi, ',');
        std::getline(ss, p, ',');
        CAPTURE(line);
        MultinomialTestSpec spec;
        spec.observed = split_numbers(o);
        spec.null_shares = split_numbers(pi);
        spec.ordering = ord == "probability" ? ExtremeOrdering::probability : ExtremeOrdering::statistic;
        spec.lambda = ord == "probability" ? 1.0 : std::stod(lam);
        CHECK(exact(spec).p.p == doctest::Approx(std::stod(p)).epsilon(1e-12));  // SciPy pmf ~1e-14 each
        ++rows;
    }
    CHECK(rows == 40);
}

TEST_CASE("closed forms: corner outcomes and a p-value below the double range") {
    // Equal shares, all N = 200 counts in one of 3 categories: only the 3 corners are that extreme,
    // so p = 3 * 3^-200 exactly (closed form), log10 p = (1 - 200) log10 3.
    const ExactMultinomialResult r = exact(spec_of({200, 0, 0}, {1, 1, 1}, ExtremeOrdering::statistic, 1));
    CHECK(r.p.log10_p == doctest::Approx(-199 * std::log10(3.0)).epsilon(1e-12));
    CHECK(r.p.p == doctest::Approx(std::pow(3.0, -199)).epsilon(1e-11));
    // k = 2, N = 2000, all in one: p = 2 * 2^-2000 = 2^-1999 ~ 1e-602 underflows; log10 stays exact.
    const ExactMultinomialResult u = exact(spec_of({2000, 0}, {1, 1}, ExtremeOrdering::probability, 1));
    CHECK(u.p.p == 0.0);
    CHECK(u.p.log10_p == doctest::Approx(-1999 * std::log10(2.0)).epsilon(1e-12));
    // Observed equal to the expected counts: every outcome is at least as extreme, p = 1.
    CHECK(exact(spec_of({5, 5, 5, 5}, {1, 1, 1, 1}, ExtremeOrdering::statistic, 0)).p.p == doctest::Approx(1).epsilon(1e-13));
    // Binomial closed form, k = 2, pi = 1/2, N = 10, x = 9: p = P(X <= 1 or X >= 9) = 22/1024.
    CHECK(exact(spec_of({9, 1}, {1, 1}, ExtremeOrdering::statistic, 1)).p.p == doctest::Approx(22.0 / 1024).epsilon(1e-14));
}

TEST_CASE("categories with a zero share are dropped") {
    // Same p as without the zero-share category (the test is about the other categories).
    const double a = exact(spec_of({3, 0, 5, 2}, {0.2, 0, 0.3, 0.5}, ExtremeOrdering::statistic, 1)).p.p;
    const double b = brute_force_p({3, 5, 2}, {0.2, 0.3, 0.5}, ExtremeOrdering::statistic, 1);
    CHECK(a == doctest::Approx(b).epsilon(1e-13));
}

TEST_CASE("the larger case of the speed target runs and stays within its estimate") {
    // N = 100, k = 6 equal shares (96.5 million outcomes): the exact run must not need them all.
    const ExactMultinomialResult r =
        exact(spec_of({20, 15, 12, 18, 25, 10}, std::vector<double>(6, 1.0), ExtremeOrdering::statistic, 1));
    CHECK(r.total_outcomes == doctest::Approx(96560646.0));  // C(105, 5) (closed form)
    CHECK(r.work_units < r.total_outcomes / 10);
    CHECK(static_cast<double>(r.work_units) < 3 * r.estimated_work);
    CHECK(static_cast<double>(r.work_units) > r.estimated_work / 10);
    CHECK(r.p.p > 0.05);  // X^2 = 9.08 on 5 df gives 0.106 asymptotically (SciPy chi2.sf)
    CHECK(r.p.p < 0.2);
}

TEST_CASE("sliced runs equal the one-call run bit for bit; cancel stops") {
    const MultinomialTestSpec spec =
        spec_of({8, 3, 5, 2, 2, 9}, {0.1, 0.2, 0.2, 0.15, 0.15, 0.2}, ExtremeOrdering::probability, 1);
    const ExactMultinomialResult one = exact(spec);
    for (std::uint64_t budget : {1ULL, 7ULL, 1000ULL}) {
        ExactMultinomialState st;
        REQUIRE(exact_multinomial_start(spec, {}, &st).ok);
        double last = -1;
        int steps = 0;
        WorkProgress pr;
        do {
            pr = exact_multinomial_step(&st, budget);
            CHECK(pr.fraction >= last);
            CHECK(pr.fraction <= 1.0);
            last = pr.fraction;
            ++steps;
        } while (!pr.done);
        CHECK(pr.fraction == 1.0);
        if (budget == 1) CHECK(steps > 10);
        ExactMultinomialResult r;
        REQUIRE(exact_multinomial_result(st, &r).ok);
        CHECK(r.p.p == one.p.p);  // bitwise
        CHECK(r.error_bound == one.error_bound);
        CHECK(r.work_units == one.work_units);
    }
    ExactMultinomialState st;
    REQUIRE(exact_multinomial_start(spec, {}, &st).ok);
    exact_multinomial_step(&st, 5);
    ExactMultinomialResult r;
    CHECK_FALSE(exact_multinomial_result(st, &r).ok);  // not finished yet
    exact_multinomial_cancel(&st);
    const WorkProgress pr = exact_multinomial_step(&st, 1000000);
    CHECK(pr.cancelled);
    CHECK_FALSE(pr.done);
    CHECK_FALSE(exact_multinomial_result(st, &r).ok);
}

TEST_CASE("refuses when the estimated work exceeds the caller's limit, offering Monte Carlo") {
    ExactMultinomialOptions opt;
    opt.max_work = 1000;
    ExactMultinomialResult r;
    const Status s = exact_multinomial_p_value(
        spec_of({20, 15, 12, 18, 25, 10}, std::vector<double>(6, 1.0), ExtremeOrdering::statistic, 1), opt, &r);
    CHECK_FALSE(s.ok);
    CHECK(s.message.find("Monte Carlo") != std::string::npos);
    opt.max_work = 0;
    CHECK_FALSE(exact_multinomial_p_value(spec_of({1, 2}, {1, 1}, ExtremeOrdering::statistic, 1), opt, &r).ok);
}

TEST_CASE("bad arguments are refused with a message naming the input") {
    ExactMultinomialResult r;
    const ExactMultinomialOptions opt;
    auto refused = [&](const MultinomialTestSpec& s, const char* word) {
        const Status st = exact_multinomial_p_value(s, opt, &r);
        CHECK_FALSE(st.ok);
        CHECK_MESSAGE(st.message.find(word) != std::string::npos, st.message);
    };
    refused(spec_of({5}, {1}, ExtremeOrdering::statistic, 1), "two categories");
    MultinomialTestSpec s = spec_of({1, 2, 3}, {1, 1}, ExtremeOrdering::statistic, 1);
    refused(s, "shares");
    s = spec_of({1, 2, 3}, {1, 1, 1}, ExtremeOrdering::statistic, 1);
    s.observed[1] = 2.5;
    refused(s, "category 2");
    s.observed[1] = -1;
    refused(s, "category 2");
    s = spec_of({1, 2, 3}, {1, -1, 1}, ExtremeOrdering::statistic, 1);
    refused(s, "category 2");
    refused(spec_of({1, 2, 3}, {1, 0, 1}, ExtremeOrdering::statistic, 1), "Category 2");
    refused(spec_of({0, 0, 0}, {1, 1, 1}, ExtremeOrdering::statistic, 1), "zero");
    refused(spec_of({1, 2, 3}, {0, 0, 0}, ExtremeOrdering::statistic, 1), "zero");
    refused(spec_of({1, 2, 3}, {1, 1, 1}, ExtremeOrdering::statistic, -1), "lambda > -1");
    refused(spec_of({1, 2, 3}, {1, 1, 1}, ExtremeOrdering::statistic, NAN), "lambda");
    s = spec_of({1, 2}, {1, 1}, ExtremeOrdering::statistic, 1);
    s.observed[0] = 3e7;
    refused(s, "too large");
}
