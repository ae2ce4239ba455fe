// Monte Carlo p-values and the portable generator: reproducibility, agreement with the exact
// p-value within 4 standard errors, the sampler's distribution, slicing and refusals.
#include <doctest/doctest.h>

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

}  // namespace

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
