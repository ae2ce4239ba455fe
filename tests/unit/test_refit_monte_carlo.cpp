// Monte Carlo with refitting (parametric bootstrap) against a NumPy/SciPy parametric bootstrap
// (tests/reference/refit_monte_carlo.csv, made by generate_refit_monte_carlo.py) within 4
// combined standard errors, and the size of the refitting test at the null by simulation.
#include <doctest/doctest.h>

#include "reference_csv.hpp"

#include <cmath>
#include <string>
#include <vector>

#include "pvalue_job.hpp"
#include "random.hpp"

using namespace tallyproof;
using tallyproof_test::reference_rows;
using tallyproof_test::split_numbers;

namespace {

Analysis poisson_analysis(const std::vector<double>& observed, std::uint64_t replicates, std::uint64_t seed) {
    Analysis a;
    for (std::size_t i = 0; i < observed.size(); ++i) a.categories.push_back(std::to_string(i));
    a.observed = observed;
    a.ordered = true;
    a.model.kind = ModelKind::poisson;
    a.pvalue.method = PValueMethod::monte_carlo;
    a.pvalue.replicates = replicates;
    a.pvalue.seed = seed;
    return a;
}

}  // namespace

TEST_CASE("refitting Monte Carlo agrees with a NumPy parametric bootstrap (refit_monte_carlo.csv)") {
    const auto rows = reference_rows("refit_monte_carlo.csv");
    REQUIRE(rows.size() == 3);
    for (const auto& row : rows) {
        const std::vector<double> observed = split_numbers(row[0]);
        const double mean_hat = std::stod(row[2]), x2 = std::stod(row[3]), p_ref = std::stod(row[4]), se_ref = std::stod(row[5]);
        const Result r = analyse_completely(poisson_analysis(observed, 100000, 7));
        REQUIRE(r.status.ok);
        REQUIRE(r.monte_carlo.computed);
        CHECK(r.monte_carlo.refit);
        CHECK(r.estimates.at(0).value == doctest::Approx(mean_hat).epsilon(1e-7));  // SciPy's optimum, tol 1e-12
        CHECK(r.statistic == doctest::Approx(x2).epsilon(1e-7));
        const double se = std::sqrt(se_ref * se_ref + r.monte_carlo.standard_error * r.monte_carlo.standard_error);
        CAPTURE(p_ref);
        CAPTURE(r.monte_carlo.p);
        CHECK(std::fabs(r.monte_carlo.p - p_ref) < 4 * se + 2.0 / 100001);
        // Reproducible: the same seed gives the same count.
        const Result again = analyse_completely(poisson_analysis(observed, 100000, 7));
        CHECK(again.monte_carlo.hits == r.monte_carlo.hits);
    }
}

TEST_CASE("the refitting test holds its size at the null (simulated tables from a Poisson)") {
    // 300 tables of N = 100 from Poisson(1.2) in cells 0..4, "5 or more" (cell shares from the
    // Poisson pmf, summed here); each tested with B = 199; rejection rate at alpha = 0.1 must lie
    // within 4 binomial standard errors of 0.1 (p = (b+1)/(B+1) is exact-size for continuous
    // statistics; discreteness can only lower the rate).
    std::vector<double> pi(6);
    double term = std::exp(-1.2), sum = 0;
    for (int x = 0; x < 5; ++x) {
        pi[static_cast<std::size_t>(x)] = term;
        sum += term;
        term *= 1.2 / (x + 1);
    }
    pi[5] = 1 - sum;  // only for drawing the test tables
    MultinomialSampler s;
    REQUIRE(make_multinomial_sampler(100, pi, &s));
    Xoshiro256 g = seed_xoshiro256(99);
    const int tables = 300;
    int rejected = 0, tested = 0;
    std::vector<int> x(6);
    for (int t = 0; t < tables; ++t) {
        sample_multinomial(&s, &g, x.data());
        std::vector<double> obs(x.begin(), x.end());
        const Result r = analyse_completely(poisson_analysis(obs, 199, 1000 + static_cast<std::uint64_t>(t)));
        if (!r.status.ok || !r.monte_carlo.computed) continue;
        ++tested;
        rejected += r.monte_carlo.p <= 0.1 ? 1 : 0;
    }
    REQUIRE(tested > 250);
    const double rate = static_cast<double>(rejected) / tested, se = std::sqrt(0.1 * 0.9 / tested);
    CAPTURE(rate);
    CHECK(std::fabs(rate - 0.1) < 4 * se);
}
