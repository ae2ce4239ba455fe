// Monte Carlo p-values and the portable generator: reproducibility, agreement with the exact
// p-value within 4 standard errors, the sampler's distribution, slicing and refusals.
#include <doctest/doctest.h>

#include "binomial_cells.hpp"

#include <boost/math/distributions/binomial.hpp>
#include <boost/math/distributions/chi_squared.hpp>
#include <cmath>
#include <vector>

#include "exact_multinomial.hpp"
#include "monte_carlo.hpp"
#include "random.hpp"

using namespace tallyproof;

namespace {

MultinomialTestSpec spec_of(const std::vector<double>& obs, const std::vector<double>& pi, ExtremeOrdering ordering,
                            double lambda) {
    MultinomialTestSpec s;
    s.observed = obs;
    s.null_shares = pi;
    s.ordering = ordering;
    s.lambda = lambda;
    return s;
}

MonteCarloResult mc(const MultinomialTestSpec& spec, std::uint64_t replicates, std::uint64_t seed) {
    MonteCarloOptions o;
    o.replicates = replicates;
    o.seed = seed;
    MonteCarloResult r;
    const Status s = monte_carlo_p_value(spec, o, &r);
    REQUIRE_MESSAGE(s.ok, s.message);
    return r;
}

// Pearson chi-square of `draws` draws of Bin(m, q) from the sampler's path against Boost's binomial
// pmf, in cells of expected count >= 50 (tails merged into the end cells); checks the sample mean and
// variance against m q and m q (1 - q) within 4 standard errors.
void check_binomial_draws(int m, double q, int draws, std::uint64_t seed) {
    CAPTURE(m);
    CAPTURE(q);
    MultinomialSampler s;
    REQUIRE(make_multinomial_sampler(m, {q, 1 - q}, &s));
    Xoshiro256 g = seed_xoshiro256(seed);
    const boost::math::binomial_distribution<double> dist(m, q);
    const double mean = m * q, var = m * q * (1 - q), sd = std::sqrt(var);
    const int a = std::max(0, static_cast<int>(mean - 12 * sd)), b = std::min(m, static_cast<int>(mean + 12 * sd) + 1);
    std::vector<long long> hits(static_cast<std::size_t>(b - a) + 1, 0);
    long long outside = 0;
    double sum = 0, sum2 = 0;
    for (int i = 0; i < draws; ++i) {
        const int x = sample_binomial(&s, 0, m, &g);
        REQUIRE((x >= 0 && x <= m));
        if (x < a || x > b) ++outside; else ++hits[static_cast<std::size_t>(x - a)];
        sum += x;
        sum2 += (x - mean) * (x - mean);
    }
    CHECK(outside == 0);  // P(beyond 12 sd) < 1e-20 for these m, q (Boost binomial cdf)
    // Cells of at least 50 expected draws (Boost pmf), binomial_cells.hpp.
    int cells = 0;
    const double chi2 = binomial_cells_chi2(hits, a, b, draws, dist, &cells);
    // Fails with probability 1e-6 if the draws are exactly binomial (Boost chi-square quantile).
    const double limit = boost::math::quantile(boost::math::complement(boost::math::chi_squared(cells - 1), 1e-6));
    CAPTURE(cells);
    CHECK(chi2 < limit);
    // Mean: SE sd / sqrt(draws); variance: SE ~ var sqrt(2 / draws) (normal fourth moment).
    CHECK(std::fabs(sum / draws - mean) < 4 * sd / std::sqrt(static_cast<double>(draws)));
    CHECK(std::fabs(sum2 / draws - var) < 4 * var * std::sqrt(2.0 / draws));
}

}  // namespace

TEST_CASE("binomials of all n trials (the first category's one table) follow Boost's binomial pmf") {
    // m = n > kDirectMaxTrials: the table of Bin(n, q_0); tests/unit/test_binomial_draw.cpp checks m < n (BTRD).
    check_binomial_draws(1000000, 0.3, 1000000, 11);
    check_binomial_draws(4097, 0.01, 300000, 12);
    check_binomial_draws(250000, 0.97, 300000, 13);
    check_binomial_draws(5120, 0.5, 300000, 14);
}

TEST_CASE("a bounded cache gives the same draws as a large one") {
    MultinomialSampler big, tiny;
    const std::vector<double> pi = {0.301, 0.176, 0.125, 0.097, 0.079, 0.067, 0.058, 0.051, 0.046};
    REQUIRE(make_multinomial_sampler(1000000, pi, &big));
    REQUIRE(make_multinomial_sampler(1000000, pi, &tiny));
    tiny.max_cached_entries = 20000;  // emptied again and again
    Xoshiro256 g1 = seed_xoshiro256(3), g2 = seed_xoshiro256(3);
    std::vector<int> a(pi.size()), b(pi.size());
    bool same = true;
    for (int r = 0; r < 2000; ++r) {
        sample_multinomial(&big, &g1, a.data());
        sample_multinomial(&tiny, &g2, b.data());
        same = same && a == b;
        long long total = 0;
        for (int x : a) total += x;
        same = same && total == 1000000;
    }
    CHECK(same);
    CHECK(tiny.cached_entries <= tiny.max_cached_entries);
    CHECK(big.cached_entries < (std::size_t(1) << 22));
}

TEST_CASE("windowed outcome scores equal the full rows") {
    for (ExtremeOrdering ord : {ExtremeOrdering::statistic, ExtremeOrdering::probability}) {
        const MultinomialTestSpec spec = spec_of({12000, 31000, 7000}, {0.25, 0.6, 0.15}, ord, 2.0 / 3);
        OutcomeScores full, win;
        REQUIRE(make_outcome_scores(spec, &full).ok);
        REQUIRE(make_outcome_scores(spec, &win, true).ok);
        CHECK(win.observed_score == full.observed_score);
        CHECK(win.threshold == full.threshold);
        bool same = true;
        for (std::size_t j = 0; j < 3; ++j) {
            CHECK(win.score_lo[j] > 0);  // the window is narrower than 0..N here
            for (int x = 0; x <= full.n; ++x) {
                same = same && outcome_score(win, j, x) == full.score[j][static_cast<std::size_t>(x)];
                const int i = x - win.score_lo[j];
                if (i >= 0 && i < static_cast<int>(win.score[j].size()))
                    same = same && win.score[j][static_cast<std::size_t>(i)] == full.score[j][static_cast<std::size_t>(x)];
            }
        }
        CHECK(same);
    }
}

TEST_CASE("Monte Carlo at N = 2e5 agrees with the chi-square p-value within 4 standard errors; reproducible") {
    // At N = 2e5 with every expected count >= 20000 the Pearson statistic's chi-square(4) approximation
    // is accurate to far below the Monte Carlo error (Boost's chi-square complement as the reference).
    const std::vector<double> pi = {0.1, 0.2, 0.3, 0.25, 0.15};
    const std::vector<double> obs = {20150, 39800, 60100, 49900, 30050};
    double x2 = 0;
    for (std::size_t j = 0; j < 5; ++j) x2 += (obs[j] - 2e5 * pi[j]) * (obs[j] - 2e5 * pi[j]) / (2e5 * pi[j]);
    const double asym = boost::math::cdf(boost::math::complement(boost::math::chi_squared(4), x2));
    const MultinomialTestSpec spec = spec_of(obs, pi, ExtremeOrdering::statistic, 1);
    const MonteCarloResult a = mc(spec, 40000, 77), b = mc(spec, 40000, 77);
    CAPTURE(asym);
    CAPTURE(a.p);
    CHECK(std::fabs(a.p - asym) < 4 * a.standard_error + 1.0 / 40001);
    CHECK(a.observed_score == doctest::Approx(x2).epsilon(1e-12));
    CHECK(a.extreme == b.extreme);
    CHECK(a.p == b.p);
}

TEST_CASE("splitmix64 seeding and xoshiro256** outputs match the reference algorithm") {
    // splitmix64 from state 0: first outputs 0xe220a8397b1dcdaf, 0x6e789e6aa1b965f4, ... (widely
    // quoted; confirmed by a Python re-implementation of Vigna's reference C code run here).
    const Xoshiro256 g0 = seed_xoshiro256(0);
    CHECK(g0.s[0] == 0xe220a8397b1dcdafULL);
    CHECK(g0.s[1] == 0x6e789e6aa1b965f4ULL);
    CHECK(g0.s[2] == 0x06c45d188009454fULL);
    CHECK(g0.s[3] == 0xf88bb8a8724c81ecULL);
    // xoshiro256** outputs from that state: Python re-implementation of xoshiro256starstar.c, run here.
    Xoshiro256 g = g0;
    CHECK(next_u64(&g) == 0x99ec5f36cb75f2b4ULL);
    CHECK(next_u64(&g) == 0xbf6e1f784956452aULL);
    CHECK(next_u64(&g) == 0x1a5f849d4933e6e0ULL);
    Xoshiro256 h = seed_xoshiro256(12345);
    for (int i = 0; i < 999; ++i) next_u64(&h);
    CHECK(next_u64(&h) == 0x3cbb8486529694b8ULL);  // 1000th output, same Python re-implementation
}

TEST_CASE("uniforms and bounded integers") {
    Xoshiro256 g = seed_xoshiro256(7);
    double sum = 0;
    int counts[7] = {0};
    const int n = 70000;
    for (int i = 0; i < n; ++i) {
        const double u = next_unit(&g);
        CHECK((u >= 0 && u < 1));
        sum += u;
        const std::uint32_t b = next_below(&g, 7);
        REQUIRE(b < 7);
        ++counts[b];
    }
    // Mean of U(0,1) is 1/2 with sd sqrt(1/12/n) ~ 0.0011 (closed form): 5 sd.
    CHECK(std::fabs(sum / n - 0.5) < 5 * std::sqrt(1.0 / 12 / n));
    // Each of 7 values: 10000 expected, sd sqrt(n p (1-p)) ~ 92.6 (closed form): 5 sd.
    for (int c : counts) CHECK(std::fabs(c - 10000.0) < 5 * 92.6);
    CHECK(next_below(&g, 1) == 0);
}

TEST_CASE("binomial alias tables hold the binomial distribution") {
    // The distribution implied by an alias table, compared with the closed-form pmf C(n,x) q^x (1-q)^(n-x).
    for (int n : {1, 5, 40, 333, 2000})
        for (double q : {0.01, 0.3, 0.5, 0.97}) {
            CAPTURE(n);
            CAPTURE(q);
            const AliasTable t = binomial_alias_table(n, q, q / (1 - q));
            const std::size_t size = t.columns.size();
            std::vector<double> implied(size, 0.0);
            for (std::size_t i = 0; i < size; ++i) {
                implied[i] += t.columns[i].accept / size;
                implied[t.columns[i].alias] += (1 - t.columns[i].accept) / size;
            }
            double covered = 0;
            for (std::size_t i = 0; i < size; ++i) {
                const int x = t.lo + static_cast<int>(i);
                const double pmf = std::exp(std::lgamma(n + 1.0) - std::lgamma(x + 1.0) - std::lgamma(n - x + 1.0) +
                                            x * std::log(q) + (n - x) * std::log1p(-q));
                // The lgamma oracle carries ~1e-16 * lgamma(n+1) ~ 1e-12 relative at n = 2000.
                CHECK(implied[i] == doctest::Approx(pmf).epsilon(1e-9));
                covered += pmf;
            }
            CHECK(covered == doctest::Approx(1.0).epsilon(1e-10));  // omitted tails are negligible
        }
    CHECK(binomial_alias_table(10, 0, 0).lo == 0);
    CHECK(binomial_alias_table(10, 1, INFINITY).lo == 10);
}

TEST_CASE("Monte Carlo agrees with the exact p-value within 4 standard errors") {
    const std::vector<MultinomialTestSpec> specs = {
        spec_of({8, 3, 5, 2, 2}, {0.2, 0.2, 0.2, 0.2, 0.2}, ExtremeOrdering::statistic, 1),
        spec_of({8, 3, 5, 2, 2}, {0.2, 0.2, 0.2, 0.2, 0.2}, ExtremeOrdering::probability, 1),
        spec_of({2, 9, 4, 1, 4}, {0.1, 0.3, 0.2, 0.15, 0.25}, ExtremeOrdering::statistic, 0),
        spec_of({0, 9, 1, 14}, {0.05, 0.35, 0.1, 0.5}, ExtremeOrdering::statistic, -0.5),
        spec_of({30, 22, 18, 40, 10, 25}, {1, 1, 1, 1, 1, 1}, ExtremeOrdering::statistic, 2.0 / 3),
        spec_of({60, 20, 12, 8}, {0.5, 0.25, 0.15, 0.1}, ExtremeOrdering::probability, 1),
    };
    for (std::size_t i = 0; i < specs.size(); ++i) {
        CAPTURE(i);
        ExactMultinomialResult ex;
        REQUIRE(exact_multinomial_p_value(specs[i], {}, &ex).ok);
        const MonteCarloResult r = mc(specs[i], 200000, 1000 + i);
        CHECK(r.replicates == 200000);
        CHECK(r.p == doctest::Approx((r.extreme + 1.0) / 200001.0).epsilon(1e-15));
        CHECK(r.standard_error == doctest::Approx(std::sqrt(r.p * (1 - r.p) / 200000)).epsilon(1e-14));
        CHECK(std::fabs(r.p - ex.p.p) < 4 * r.standard_error + 1.0 / 200001);
        CHECK(r.observed_score == ex.observed_score);
    }
}

TEST_CASE("the same seed gives the same result; another seed does not") {
    const MultinomialTestSpec spec = spec_of({95, 110, 98, 102, 88, 105, 97, 101, 99, 105}, std::vector<double>(10, 1.0),
                                             ExtremeOrdering::statistic, 1);
    const MonteCarloResult a = mc(spec, 20000, 42), b = mc(spec, 20000, 42), c = mc(spec, 20000, 43);
    CHECK(a.extreme == b.extreme);
    CHECK(a.p == b.p);
    CHECK(a.seed == 42);
    CHECK(a.extreme != c.extreme);  // could coincide by chance with probability ~1/150
}

TEST_CASE("sliced runs equal the one-call run; progress; cancel") {
    const MultinomialTestSpec spec = spec_of({8, 3, 5, 2, 2}, {0.2, 0.2, 0.2, 0.2, 0.2}, ExtremeOrdering::statistic, 1);
    const MonteCarloResult one = mc(spec, 5000, 9);
    MonteCarloState st;
    MonteCarloOptions o;
    o.replicates = 5000;
    o.seed = 9;
    REQUIRE(monte_carlo_start(spec, o, &st).ok);
    WorkProgress pr;
    double last = 0;
    do {
        pr = monte_carlo_step(&st, 333);
        CHECK(pr.fraction >= last);
        CHECK(pr.units_done <= 5000);
        last = pr.fraction;
    } while (!pr.done);
    CHECK(pr.fraction == 1.0);
    MonteCarloResult r;
    REQUIRE(monte_carlo_result(st, &r).ok);
    CHECK(r.extreme == one.extreme);
    CHECK(r.p == one.p);
    // A step does at most its budget.
    REQUIRE(monte_carlo_start(spec, o, &st).ok);
    CHECK(monte_carlo_step(&st, 17).units_done == 17);
    CHECK_FALSE(monte_carlo_result(st, &r).ok);
    monte_carlo_cancel(&st);
    pr = monte_carlo_step(&st, 100000);
    CHECK(pr.cancelled);
    CHECK(pr.units_done == 17);
    CHECK_FALSE(monte_carlo_result(st, &r).ok);
}

TEST_CASE("bad arguments are refused") {
    MonteCarloResult r;
    MonteCarloOptions o;
    o.replicates = 0;
    CHECK_FALSE(monte_carlo_p_value(spec_of({1, 2}, {1, 1}, ExtremeOrdering::statistic, 1), o, &r).ok);
    o.replicates = 100;
    const Status s = monte_carlo_p_value(spec_of({1, 2}, {1, 1}, ExtremeOrdering::statistic, -2), o, &r);
    CHECK_FALSE(s.ok);
    CHECK(s.message.find("lambda") != std::string::npos);
    CHECK_FALSE(monte_carlo_p_value(spec_of({1, 2.5}, {1, 1}, ExtremeOrdering::statistic, 1), o, &r).ok);
    CHECK_FALSE(monte_carlo_p_value(spec_of({1, 2}, {1}, ExtremeOrdering::statistic, 1), o, &r).ok);
    MultinomialSampler sampler;
    CHECK_FALSE(make_multinomial_sampler(5, {}, &sampler));
    CHECK_FALSE(make_multinomial_sampler(5, {0, 0}, &sampler));
    CHECK_FALSE(make_multinomial_sampler(-1, {1, 1}, &sampler));
}
