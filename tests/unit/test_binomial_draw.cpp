// Table-free binomial draws (core/numerics/binomial_draw.hpp: BTRD, Hörmann 1993; the waiting-time
// method, Devroye 1986) as the multinomial sampler makes them for more than kDirectMaxTrials trials:
// Pearson chi-square of 1e6 draws against Boost.Math's binomial pmf (the reference) for q near 0,
// 1/2 and near 1 at m = 5000 to 2e9, sample mean and variance against m q and m q (1 - q), and
// determinism (same seed, same draws).
#include <doctest/doctest.h>

#include "binomial_cells.hpp"

#include <boost/math/distributions/binomial.hpp>
#include <boost/math/distributions/chi_squared.hpp>
#include <cmath>
#include <cstdint>
#include <vector>

#include "binomial_draw.hpp"
#include "random.hpp"

using namespace tallyproof;

namespace {

// Draws Bin(m, q) `draws` times through sample_binomial (the path Monte Carlo uses) and checks them
// against Boost's binomial pmf: cells of expected count >= 50 (tails merged into the end cells),
// failing with probability 1e-6 when the draws are exactly binomial (Boost's chi-square quantile).
void check_against_boost(int m, double q, int draws, std::uint64_t seed) {
    CAPTURE(m);
    CAPTURE(q);
    REQUIRE(m > kDirectMaxTrials);  // the table-free path
    MultinomialSampler s;  // n = m + 1: draws of m < n trials (the first category's table is for n only)
    REQUIRE(make_multinomial_sampler(m + 1, {q, 1 - q}, &s));
    Xoshiro256 g = seed_xoshiro256(seed);
    const boost::math::binomial_distribution<double> dist(m, q);
    const double mean = m * q, var = m * q * (1 - q), sd = std::sqrt(var);
    const int a = std::max(0, static_cast<int>(mean - 12 * sd)), b = std::min(m, static_cast<int>(mean + 12 * sd) + 1);
    std::vector<long long> hits(static_cast<std::size_t>(b - a) + 1, 0);
    long long outside = 0, bad = 0;
    double sum = 0, sum2 = 0;
    for (int i = 0; i < draws; ++i) {
        const int x = sample_binomial(&s, 0, m, &g);
        if (x < 0 || x > m) ++bad;
        if (x < a || x > b) ++outside; else ++hits[static_cast<std::size_t>(x - a)];
        sum += x;
        sum2 += (x - mean) * (x - mean);
    }
    CHECK(bad == 0);
    CHECK(outside == 0);  // P(beyond 12 sd) < 1e-20 for these m, q (Boost binomial cdf)
    // Cells of at least 50 expected draws (Boost pmf), binomial_cells.hpp.
    int cells = 0;
    const double chi2 = binomial_cells_chi2(hits, a, b, draws, dist, &cells);
    const double limit = boost::math::quantile(boost::math::complement(boost::math::chi_squared(cells - 1), 1e-6));
    CAPTURE(cells);
    CAPTURE(chi2);
    CHECK(cells >= 5);
    CHECK(chi2 < limit);
    // Mean: SE sd / sqrt(draws); variance: SE ~ var sqrt(2 / draws) (normal fourth moment).
    CHECK(std::fabs(sum / draws - mean) < 4 * sd / std::sqrt(static_cast<double>(draws)));
    CHECK(std::fabs(sum2 / draws - var) < 4 * var * std::sqrt(2.0 / draws) + 4 * var / draws);
}

}  // namespace

TEST_CASE("BTRD draws follow Boost's binomial pmf (q near 1/2, m = 5000 to 2e9)") {
    check_against_boost(5000, 0.5, 1000000, 101);
    check_against_boost(100000, 0.3, 1000000, 102);
    check_against_boost(1000000, 0.5, 1000000, 103);
    check_against_boost(1000000000, 0.5, 1000000, 104);
}

TEST_CASE("table-free draws with q near 0 and near 1 follow Boost's binomial pmf") {
    check_against_boost(5000, 0.001, 1000000, 201);          // mode 5: waiting-time method
    check_against_boost(5000, 0.003, 1000000, 202);          // mode 15: BTRD just past its switch
    check_against_boost(5000, 0.999, 1000000, 203);          // drawn as m - Bin(m, 0.001)
    check_against_boost(100000, 1e-5, 1000000, 204);         // mode 1
    check_against_boost(1000000, 2e-3, 1000000, 205);        // mode 2000
    check_against_boost(1000000, 0.97, 1000000, 206);
    check_against_boost(1000000000, 1e-8, 1000000, 207);     // mode 10: waiting-time method at m = 1e9
    check_against_boost(1000000000, 1e-6, 1000000, 208);     // mode 1000 at m = 1e9
    check_against_boost(2000000000, 0.9999, 1000000, 209);   // m - Bin(2e9, 1e-4)
}

TEST_CASE("table-free draws: the same seed gives the same draws, another seed others; edge shares") {
    const BinomialShare half = binomial_share(0.5, 1.0), small = binomial_share(1e-4, 1e-4 / (1 - 1e-4));
    auto run = [&](std::uint64_t seed) {
        Xoshiro256 g = seed_xoshiro256(seed);
        std::vector<int> v;
        for (int i = 0; i < 20000; ++i) v.push_back(draw_binomial(5000 + 37 * i, i % 2 ? half : small, &g));
        return v;
    };
    CHECK(run(5) == run(5));
    CHECK(run(5) != run(6));
    Xoshiro256 g = seed_xoshiro256(1);
    CHECK(draw_binomial(0, half, &g) == 0);
    CHECK(draw_binomial(1000000, BinomialShare{}, &g) == 0);  // p = 0
    // q = 1 (the last category holding everything left): every trial succeeds.
    MultinomialSampler s;
    REQUIRE(make_multinomial_sampler(100000, {1.0, 0.0}, &s));
    CHECK(sample_binomial(&s, 0, 100000, &g) == 100000);
}
