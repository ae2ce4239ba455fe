// Fitted distributions over ordered categories: grouped maximum likelihood against SciPy,
// closed forms and the Bortkiewicz horse-kick data; refusals; Chernoff-Lehmann df bounds.
#include <doctest/doctest.h>

#include <cmath>
#include <fstream>
#include <limits>
#include <map>
#include <sstream>
#include <string>

#include "fit_binned_continuous.hpp"
#include "fit_discrete.hpp"
#include "fit_distribution.hpp"

using namespace tallyproof;

namespace {

const double kInf = std::numeric_limits<double>::infinity();

std::vector<IntegerBin> singles(int from, int to) {
    std::vector<IntegerBin> b;
    for (int k = from; k <= to; ++k) b.push_back({double(k), double(k)});
    return b;
}

double probability_sum(const FittedDistribution& f) {
    double s = 0;
    for (double p : f.probabilities) s += p;
    return s;
}

bool contains(const std::string& s, const char* part) { return s.find(part) != std::string::npos; }

// tests/reference/fitted_distributions.csv as case|quantity|index -> value.
std::map<std::string, double> load_reference() {
    std::map<std::string, double> m;
    std::ifstream in(std::string(TALLYPROOF_REFERENCE_DIR) + "/fitted_distributions.csv");
    std::string line;
    bool header = true;
    while (std::getline(in, line)) {
        if (line.empty() || line[0] == '#') continue;
        if (header) { header = false; continue; }
        std::stringstream ss(line);
        std::string c, q, i, v;
        std::getline(ss, c, ',');
        std::getline(ss, q, ',');
        std::getline(ss, i, ',');
        std::getline(ss, v, ',');
        m[c + "|" + q + "|" + i] = std::stod(v);
    }
    return m;
}

// Compares a fit with the SciPy reference: estimates to 1e-8 relative (the reference is good to
// ~1e-10, ours to about the same), probabilities to 1e-8 relative, log-likelihood to 1e-11.
void check_against_reference(const std::string& name, const FittedDistribution& f) {
    static const std::map<std::string, double> ref = load_reference();
    CAPTURE(name);
    REQUIRE_MESSAGE(f.status.ok, f.status.message);
    int estimates = 0;
    for (const auto& p : f.parameters) {
        auto it = ref.find(name + "|estimate|" + p.name);
        if (it == ref.end()) continue;
        CAPTURE(p.name);
        CHECK(p.estimated);
        CHECK(p.value == doctest::Approx(it->second).epsilon(1e-8));
        ++estimates;
    }
    CHECK(estimates == f.estimated_parameters);
    for (std::size_t i = 0; i < f.probabilities.size(); ++i) {
        auto it = ref.find(name + "|probability|" + std::to_string(i + 1));
        REQUIRE(it != ref.end());
        CAPTURE(i);
        CHECK(f.probabilities[i] == doctest::Approx(it->second).epsilon(1e-8));
    }
    CHECK(ref.count(name + "|probability|" + std::to_string(f.probabilities.size() + 1)) == 0);
    CHECK(f.log_likelihood == doctest::Approx(ref.at(name + "|log_likelihood|")).epsilon(1e-11));
    CHECK(probability_sum(f) == doctest::Approx(1.0).epsilon(1e-14));
}

const std::vector<double> kHorseKicks = {109, 65, 22, 3, 1};  // Bortkiewicz (1898), deaths 0..4 per corps-year

const std::vector<double> kNegBinCounts = {70, 38, 26, 18, 12, 9, 27};
std::vector<IntegerBin> negbin_bins() {
    auto b = singles(0, 5);
    b.push_back({6, kInf});
    return b;
}

const std::vector<double> kHeightEdges = {-kInf, 150, 155, 160, 165, 170, 175, 180, kInf};
const std::vector<double> kHeightCounts = {4, 12, 35, 60, 52, 28, 7, 2};

}  // namespace

TEST_CASE("Bortkiewicz horse kicks: the fitted Poisson mean is the published 0.61") {
    // Bortkiewicz (1898), Das Gesetz der kleinen Zahlen: 200 corps-years, deaths 0:109, 1:65,
    // 2:22, 3:3, 4:1; mean 122 / 200 = 0.61 (published value, from memory; closed form here).
    // Single-value bins plus an added empty "5 or more" cell: the grouped MLE is the sample mean.
    DiscreteFitOptions o;
    o.tail_cells = TailCells::add_empty_cells;
    const FittedDistribution f = fit_poisson(singles(0, 4), kHorseKicks, std::nullopt, o);
    REQUIRE_MESSAGE(f.status.ok, f.status.message);
    REQUIRE(f.parameter("mean") != nullptr);
    CHECK(f.parameter("mean")->estimated);
    CHECK(f.parameter("mean")->value == doctest::Approx(0.61).epsilon(1e-10));
    CHECK(f.estimated_parameters == 1);
    REQUIRE(f.probabilities.size() == 6);
    CHECK(f.added[5]);
    CHECK(f.lo[5] == 5);
    CHECK(f.hi[5] == kInf);
    CHECK(f.observed[5] == 0);
    CHECK(f.df == 4);  // 6 cells - 1 - 1
    CHECK(f.warnings.size() == 1);
    // Expected deaths-per-corps-year counts, 200 * Poisson(0.61) pmf (closed form), and as
    // commonly printed to one decimal (108.7, 66.3, 20.2, 4.1, 0.6; from memory).
    const double printed[] = {108.7, 66.3, 20.2, 4.1, 0.6};
    double fact = 1;
    for (int k = 0; k <= 4; ++k) {
        if (k > 0) fact *= k;
        CAPTURE(k);
        const double pmf = std::exp(-0.61) * std::pow(0.61, k) / fact;
        CHECK(f.probabilities[k] == doctest::Approx(pmf).epsilon(1e-9));
        CHECK(std::fabs(200 * f.probabilities[k] - printed[k]) < 0.05);
    }
    check_against_reference("bortkiewicz_empty", f);
}

TEST_CASE("Bortkiewicz with the last bin read as 4 or more (the default)") {
    const FittedDistribution f = fit_poisson(singles(0, 4), kHorseKicks, std::nullopt);
    REQUIRE(f.status.ok);
    CHECK(f.hi.back() == kInf);
    CHECK(f.probabilities.size() == 5);
    CHECK(f.df == 3);
    CHECK(f.parameter("mean")->value > 0.61);  // the one 4 now counts as "4 or more"
    REQUIRE(f.warnings.size() == 1);
    CHECK(contains(f.warnings[0], "4 or more"));
    check_against_reference("bortkiewicz_widen", f);
}

TEST_CASE("property: with exact single-value cells the Poisson grouped MLE is the sample mean") {
    // Closed form: the grouped likelihood is then the ungrouped one, maximised at the mean.
    DiscreteFitOptions o;
    o.tail_cells = TailCells::add_empty_cells;
    const std::vector<std::vector<double>> sets = {
        {5, 9, 14, 10, 6, 3, 2, 1}, {1, 0, 0, 0, 0, 0, 0, 4}, {300, 2, 1}, {0, 0, 7, 12, 30, 18, 4}};
    for (const auto& counts : sets) {
        double n = 0, s = 0;
        for (std::size_t k = 0; k < counts.size(); ++k) { n += counts[k]; s += k * counts[k]; }
        const FittedDistribution f = fit_poisson(singles(0, int(counts.size()) - 1), counts, std::nullopt, o);
        REQUIRE_MESSAGE(f.status.ok, f.status.message);
        CHECK(f.parameter("mean")->value == doctest::Approx(s / n).epsilon(1e-9));
        CHECK(probability_sum(f) == doctest::Approx(1.0).epsilon(1e-14));
    }
    // Bins starting above 0: a "0-1" cell with count 0 is added in front, and it stays exact.
    const FittedDistribution g = fit_poisson(singles(2, 6), {10, 14, 9, 5, 2}, std::nullopt, o);
    REQUIRE(g.status.ok);
    CHECK(g.added.front());
    CHECK(g.lo.front() == 0);
    CHECK(g.hi.front() == 1);
    CHECK(g.parameter("mean")->value == doctest::Approx((20 + 42 + 36 + 25 + 12) / 40.0).epsilon(1e-9));
}

TEST_CASE("Poisson with open bins at both ends, against SciPy") {
    std::vector<IntegerBin> b = {{-kInf, 1}, {2, 2}, {3, 3}, {4, 4}, {5, kInf}};
    const FittedDistribution f = fit_poisson(b, {30, 25, 22, 14, 19}, std::nullopt);
    CHECK(f.lo.front() == 0);  // "1 or fewer" clamped to the support
    CHECK(f.warnings.empty());
    check_against_reference("poisson_open_both", f);
    // By default a first bin above the support minimum is read as "hi or fewer".
    const FittedDistribution g = fit_poisson({{1, 1}, {2, 2}, {3, 3}, {4, 4}, {5, kInf}}, {30, 25, 22, 14, 19}, std::nullopt);
    REQUIRE(g.status.ok);
    CHECK(g.lo.front() == 0);
    REQUIRE(g.warnings.size() == 1);
    CHECK(contains(g.warnings[0], "1 or fewer"));
    check_against_reference("poisson_open_both", g);
}

TEST_CASE("binomial: Weldon's dice") {
    // Weldon's 26,306 throws of 12 dice, counting fives and sixes (W. F. R. Weldon, 1894; counts
    // from memory, as widely reprinted; they total 26,306 as they should); the fitted p is the mean / 12 = 106602 / 315672 (closed form,
    // single-value cells covering 0..12), published as 0.3377 (from memory).
    const std::vector<double> counts = {185, 1149, 3265, 5475, 6114, 5194, 3067, 1331, 403, 105, 14, 4, 0};
    const FittedDistribution f = fit_binomial(singles(0, 12), counts, 12, std::nullopt);
    REQUIRE_MESSAGE(f.status.ok, f.status.message);
    CHECK(f.parameter("p")->value == doctest::Approx(106602.0 / 315672.0).epsilon(1e-9));
    CHECK(std::fabs(f.parameter("p")->value - 0.3377) < 0.00005);
    CHECK_FALSE(f.parameter("trials")->estimated);
    CHECK(f.warnings.empty());
    CHECK(f.df == 11);
    // Grouping 9..12 into one bin (SciPy reference).
    auto b = singles(0, 8);
    b.push_back({9, 12});
    check_against_reference("weldon_open", fit_binomial(b, {185, 1149, 3265, 5475, 6114, 5194, 3067, 1331, 403, 123}, 12, std::nullopt));
    // A last bin "9 or more" is clamped to the 12 trials.
    b.back().hi = kInf;
    const FittedDistribution g = fit_binomial(b, {185, 1149, 3265, 5475, 6114, 5194, 3067, 1331, 403, 123}, 12, std::nullopt);
    REQUIRE(g.status.ok);
    CHECK(g.hi.back() == 12);
    check_against_reference("weldon_open", g);
}

TEST_CASE("geometric: closed form and SciPy") {
    // Closed form: with cells 0..3 and "4 or more", L = p^(N - n4) (1 - p)^(sum k n_k + 4 n4), so
    // p = (N - n4) / (N - n4 + sum) = 95 / (95 + 88).
    std::vector<IntegerBin> b = singles(0, 3);
    b.push_back({4, kInf});
    const FittedDistribution f = fit_geometric(b, {52, 25, 11, 7, 5}, std::nullopt);
    REQUIRE(f.status.ok);
    CHECK(f.parameter("p")->value == doctest::Approx(95.0 / 183.0).epsilon(1e-9));
    CHECK(f.parameter("mean")->value == doctest::Approx(88.0 / 95.0).epsilon(1e-8));  // (1 - p) / p
    check_against_reference("geometric", f);
    // Given p: P(X >= 4) = (1 - p)^4 (closed form).
    const FittedDistribution g = fit_geometric(b, {52, 25, 11, 7, 5}, 0.3);
    REQUIRE(g.status.ok);
    CHECK(g.estimated_parameters == 0);
    CHECK(g.df == 4);
    CHECK(g.probabilities.back() == doctest::Approx(std::pow(0.7, 4)).epsilon(1e-14));
    CHECK(g.probabilities[2] == doctest::Approx(0.3 * 0.49).epsilon(1e-14));
}

TEST_CASE("negative binomial: size and mean, each given or estimated, against SciPy") {
    const FittedDistribution both = fit_negative_binomial(negbin_bins(), kNegBinCounts, {});
    check_against_reference("nb_both", both);
    CHECK(both.estimated_parameters == 2);
    CHECK(both.df == 4);
    const double r = both.parameter("size")->value, p = both.parameter("p")->value;
    CHECK(both.parameter("mean")->value == doctest::Approx(r * (1 - p) / p).epsilon(1e-14));

    NegativeBinomialParameters size_given;
    size_given.size = 2.0;
    const FittedDistribution s = fit_negative_binomial(negbin_bins(), kNegBinCounts, size_given);
    check_against_reference("nb_size_given", s);
    CHECK_FALSE(s.parameter("size")->estimated);
    CHECK(s.estimated_parameters == 1);

    NegativeBinomialParameters mean_given;
    mean_given.mean = 2.0;
    const FittedDistribution m = fit_negative_binomial(negbin_bins(), kNegBinCounts, mean_given);
    check_against_reference("nb_mean_given", m);
    CHECK(m.parameter("mean")->value == 2.0);
    CHECK_FALSE(m.parameter("mean")->estimated);

    // size 1 is the geometric with the same p (closed form: NB(1, p) = geometric(p)).
    NegativeBinomialParameters one;
    one.size = 1.0;
    one.p = 0.4;
    const FittedDistribution nb1 = fit_negative_binomial(negbin_bins(), kNegBinCounts, one);
    const FittedDistribution geo = fit_geometric(negbin_bins(), kNegBinCounts, 0.4);
    REQUIRE(nb1.status.ok);
    REQUIRE(geo.status.ok);
    for (std::size_t i = 0; i < geo.probabilities.size(); ++i)
        CHECK(nb1.probabilities[i] == doctest::Approx(geo.probabilities[i]).epsilon(1e-13));
    CHECK(nb1.estimated_parameters == 0);
}

TEST_CASE("negative binomial refuses counts that are not over-dispersed") {
    // Bortkiewicz's counts have variance 0.6079 below their mean 0.61 (closed form): with exact
    // cells there is no finite size.
    DiscreteFitOptions o;
    o.tail_cells = TailCells::add_empty_cells;
    const FittedDistribution f = fit_negative_binomial(singles(0, 4), kHorseKicks, {}, o);
    CHECK_FALSE(f.status.ok);
    CHECK(contains(f.status.message, "over-dispersed"));
    // Read as "4 or more", the open cell leaves room for a finite size. SciPy 1.10 Nelder-Mead on
    // (log size, log mean) from five starts (size 1 to 1e5): size 140.4277-140.4283, mean 0.61068146,
    // log-likelihood -205.97861347928955 (the size is poorly determined, hence the 1e-5).
    const FittedDistribution g = fit_negative_binomial(singles(0, 4), kHorseKicks, {});
    REQUIRE_MESSAGE(g.status.ok, g.status.message);
    CHECK(g.parameter("size")->value == doctest::Approx(140.428).epsilon(1e-5));
    CHECK(g.parameter("mean")->value == doctest::Approx(0.61068146).epsilon(1e-7));
    CHECK(g.log_likelihood == doctest::Approx(-205.97861347928955).epsilon(1e-13));
}

TEST_CASE("discrete uniform over the bins' range") {
    // Closed form: a fair die, 1/6 per face; a bin's share is its width over the range's.
    const FittedDistribution f = fit_discrete_uniform(singles(1, 6), {16, 18, 16, 14, 12, 24});
    REQUIRE(f.status.ok);
    for (double p : f.probabilities) CHECK(p == doctest::Approx(1.0 / 6).epsilon(1e-15));
    CHECK(f.estimated_parameters == 0);
    CHECK(f.df == 5);
    const FittedDistribution g = fit_discrete_uniform({{1, 2}, {3, 6}}, {10, 20});
    REQUIRE(g.status.ok);
    CHECK(g.probabilities[0] == doctest::Approx(2.0 / 6).epsilon(1e-15));
    CHECK(g.probabilities[1] == doctest::Approx(4.0 / 6).epsilon(1e-15));
    CHECK_FALSE(fit_discrete_uniform({{1, 2}, {3, kInf}}, {10, 20}).status.ok);
    CHECK_FALSE(fit_discrete_uniform({{-kInf, 2}, {3, 4}}, {10, 20}).status.ok);
}

TEST_CASE("tail cells come from the complement, never 1 - cdf") {
    // mpmath 1.2 at 40 digits, gammainc(30, 0, 0.5, regularized=True): P(X >= 30), X ~ Poisson(0.5),
    // = 2.1644672981498644932e-42; 1 - cdf would give 0.
    const FittedDistribution f = fit_poisson({{0, 0}, {1, 29}, {30, kInf}}, {5, 5, 0}, 0.5);
    REQUIRE(f.status.ok);
    CHECK(f.probabilities[2] == doctest::Approx(2.1644672981498644932e-42).epsilon(1e-12));
    // mpmath 1.2 at 40 digits: erfc(10/sqrt 2)/2 - erfc(11/sqrt 2)/2 = 7.6196619582030761984e-24 and
    // erfc(10/sqrt 2)/2 = 7.619853024160526066e-24 (normal mean 0, sd 1, bins [10, 11) and [10, inf)).
    const FittedDistribution n = fit_normal({-kInf, 0, 10, 11, kInf}, {5, 5, 0, 0}, 0.0, 1.0);
    REQUIRE(n.status.ok);
    CHECK(n.probabilities[2] == doctest::Approx(7.6196619582030761984e-24).epsilon(1e-12));
    const FittedDistribution n2 = fit_normal({-kInf, 0, 10, kInf}, {5, 5, 0}, 0.0, 1.0);
    REQUIRE(n2.status.ok);
    CHECK(n2.probabilities[2] == doctest::Approx(7.619853024160526066e-24).epsilon(1e-13));
    CHECK(n2.probabilities[0] == doctest::Approx(0.5).epsilon(1e-15));
    // Closed form: symmetric normal bins mirror each other.
    const FittedDistribution s = fit_normal({-kInf, -11, -10, 0, kInf}, {0, 0, 5, 5}, 0.0, 1.0);
    REQUIRE(s.status.ok);
    CHECK(s.probabilities[1] == doctest::Approx(7.6196619582030761984e-24).epsilon(1e-12));
}

TEST_CASE("binned normal: mean and sd estimated, or one of them given, against SciPy") {
    const FittedDistribution both = fit_normal(kHeightEdges, kHeightCounts, std::nullopt, std::nullopt);
    check_against_reference("normal_both", both);
    CHECK(both.df == 5);
    check_against_reference("normal_sd_given", fit_normal(kHeightEdges, kHeightCounts, std::nullopt, 6.0));
    check_against_reference("normal_mean_given", fit_normal(kHeightEdges, kHeightCounts, 165.0, std::nullopt));
    // Finite outer edges are widened to -inf / +inf by default, giving the same fit.
    std::vector<double> closed = kHeightEdges;
    closed.front() = 100;
    closed.back() = 250;
    const FittedDistribution w = fit_normal(closed, kHeightCounts, std::nullopt, std::nullopt);
    REQUIRE(w.status.ok);
    CHECK(w.warnings.size() == 2);
    CHECK(w.lo.front() == -kInf);
    check_against_reference("normal_both", w);
    // Or empty cells are added outside them.
    ContinuousFitOptions o;
    o.tail_cells = TailCells::add_empty_cells;
    const FittedDistribution a = fit_normal(closed, kHeightCounts, std::nullopt, std::nullopt, o);
    REQUIRE(a.status.ok);
    CHECK(a.probabilities.size() == 10);
    CHECK(a.added.front());
    CHECK(a.added.back());
    CHECK(a.hi.front() == 100);
    CHECK(probability_sum(a) == doctest::Approx(1.0).epsilon(1e-14));
}

TEST_CASE("binned lognormal and exponential against SciPy") {
    check_against_reference("lognormal_both",
                            fit_lognormal({0, 1, 2, 5, 10, 20, 50, kInf}, {8, 20, 41, 30, 18, 9, 4}, std::nullopt, std::nullopt));
    // A first edge at or below 0 means "below the second edge".
    check_against_reference("lognormal_both",
                            fit_lognormal({-kInf, 1, 2, 5, 10, 20, 50, kInf}, {8, 20, 41, 30, 18, 9, 4}, std::nullopt, std::nullopt));
    check_against_reference("exponential", fit_exponential({0, 1, 2, 4, 8, kInf}, {40, 25, 20, 10, 5}, std::nullopt));
}

TEST_CASE("exponential with equal-width bins: closed form") {
    // Bins of width w from 0 with an open last bin make q = exp(-rate w) geometric:
    // q = S / (N - n_last + S), S = sum j n_j + (K - 1) n_last = 30 + 24 + 3 * 8 = 78, N - n_last = 92.
    const FittedDistribution f = fit_exponential({0, 2, 4, 6, kInf}, {50, 30, 12, 8}, std::nullopt);
    REQUIRE_MESSAGE(f.status.ok, f.status.message);
    CHECK(f.parameter("rate")->value == doctest::Approx(-std::log(78.0 / 170.0) / 2).epsilon(1e-9));
    CHECK(f.df == 2);
}

TEST_CASE("parameters that are given out of range are refused by name") {
    const auto b = singles(0, 4);
    for (double bad : {0.0, -1.0, kInf, std::nan("")}) {
        CAPTURE(bad);
        const FittedDistribution f = fit_poisson(b, kHorseKicks, bad);
        CHECK_FALSE(f.status.ok);
        CHECK(contains(f.status.message, "Poisson mean"));
        CHECK_FALSE(fit_geometric(b, kHorseKicks, bad).status.ok);
        CHECK_FALSE(fit_normal(kHeightEdges, kHeightCounts, std::nullopt, bad).status.ok);
        CHECK_FALSE(fit_lognormal({0, 1, 2, kInf}, {1, 2, 3}, std::nullopt, bad).status.ok);
        CHECK_FALSE(fit_exponential({0, 1, 2, kInf}, {1, 2, 3}, bad).status.ok);
        NegativeBinomialParameters s;
        s.size = bad;
        CHECK(contains(fit_negative_binomial(b, kHorseKicks, s).status.message, "size"));
    }
    for (double p : {0.0, 1.0, 1.5, -0.2}) {
        CAPTURE(p);
        CHECK(contains(fit_binomial(b, kHorseKicks, 4, p).status.message, "binomial p"));
        CHECK(contains(fit_geometric(b, kHorseKicks, p).status.message, "geometric p"));
    }
    for (double n : {0.0, 2.5, -3.0, kInf}) {
        CAPTURE(n);
        CHECK(contains(fit_binomial(b, kHorseKicks, n, std::nullopt).status.message, "trials"));
    }
    NegativeBinomialParameters both;
    both.p = 0.5;
    both.mean = 1.0;
    CHECK(contains(fit_negative_binomial(b, kHorseKicks, both).status.message, "not both"));
    CHECK_FALSE(fit_normal(kHeightEdges, kHeightCounts, kInf, std::nullopt).status.ok);
}

TEST_CASE("counts that cannot identify a parameter are refused") {
    // All counts in one bin.
    const FittedDistribution f = fit_poisson(singles(0, 4), {0, 0, 12, 0, 0}, std::nullopt);
    CHECK_FALSE(f.status.ok);
    CHECK(contains(f.status.message, "one bin (2)"));
    CHECK_FALSE(fit_poisson(singles(0, 4), {30, 0, 0, 0, 0}, std::nullopt).status.ok);
    CHECK_FALSE(fit_binomial(singles(0, 4), {0, 0, 0, 0, 9}, 4, std::nullopt).status.ok);
    CHECK_FALSE(fit_geometric(singles(0, 4), {0, 0, 0, 0, 9}, std::nullopt).status.ok);
    CHECK_FALSE(fit_exponential({0, 1, 2, kInf}, {0, 0, 9}, std::nullopt).status.ok);
    CHECK_FALSE(fit_normal(kHeightEdges, {0, 0, 0, 60, 0, 0, 0, 0}, std::nullopt, 5.0).status.ok);
    // The same counts are fine when nothing is estimated.
    CHECK(fit_poisson(singles(0, 4), {0, 0, 12, 0, 0}, 2.0).status.ok);
    // Normal mean and sd from two neighbouring bins: the sd runs to 0.
    const FittedDistribution g = fit_normal(kHeightEdges, {0, 0, 35, 60, 0, 0, 0, 0}, std::nullopt, std::nullopt);
    CHECK_FALSE(g.status.ok);
    CHECK(contains(g.status.message, "neighbouring"));
    // ... but three bins are enough.
    CHECK(fit_normal(kHeightEdges, {0, 0, 35, 60, 1, 0, 0, 0}, std::nullopt, std::nullopt).status.ok);
    // Too few cells for the parameters: 2 cells, 1 estimate, df 0.
    const FittedDistribution h = fit_poisson({{0, 0}, {1, kInf}}, {10, 5}, std::nullopt);
    CHECK_FALSE(h.status.ok);
    CHECK(contains(h.status.message, "degrees of freedom"));
    CHECK(fit_poisson({{0, 0}, {1, kInf}}, {10, 5}, 0.4).status.ok);  // nothing estimated: df 1
}

TEST_CASE("malformed bins and counts are refused with the bin named") {
    const std::vector<double> c3 = {1, 2, 3};
    CHECK(contains(fit_poisson({{0, 0}, {2, 2}, {3, kInf}}, c3, 1.0).status.message, "No bin holds the values 1"));
    CHECK(contains(fit_poisson({{0, 1}, {1, 2}, {3, kInf}}, c3, 1.0).status.message, "overlaps"));
    CHECK(contains(fit_poisson({{0, 0.5}, {1, 2}, {3, kInf}}, c3, 1.0).status.message, "whole-number"));
    CHECK(contains(fit_poisson({{0, 0}, {1, kInf}, {3, kInf}}, c3, 1.0).status.message, "Bin 2"));
    CHECK(contains(fit_poisson({{0, 0}, {-kInf, 2}, {3, kInf}}, c3, 1.0).status.message, "Bin 2"));
    CHECK(contains(fit_poisson({{0, 0}, {3, 2}, {3, kInf}}, c3, 1.0).status.message, "Bin 2"));
    CHECK(contains(fit_poisson({{-5, -1}, {0, 2}, {3, kInf}}, c3, 1.0).status.message, "Bin 1"));
    CHECK(contains(fit_binomial({{0, 3}, {4, 6}, {7, 9}}, c3, 6, 0.5).status.message, "Bin 3"));
    CHECK(contains(fit_poisson(singles(0, 2), {1, 2}, 1.0).status.message, "3 bins but 2"));
    CHECK(contains(fit_poisson(singles(0, 2), {1, -2, 3}, 1.0).status.message, "bin 2"));
    CHECK(contains(fit_poisson(singles(0, 2), {1, std::nan(""), 3}, 1.0).status.message, "bin 2"));
    CHECK(contains(fit_poisson(singles(0, 2), {0, 0, 0}, 1.0).status.message, "all zero"));
    CHECK_FALSE(fit_poisson(singles(0, 0), {4}, 1.0).status.ok);
    CHECK_FALSE(fit_poisson({}, {}, 1.0).status.ok);
    // Edges
    CHECK(contains(fit_normal({0, 2, 2, 3}, c3, 0.0, 1.0).status.message, "increase"));
    CHECK(contains(fit_normal({0, std::nan(""), 2, 3}, c3, 0.0, 1.0).status.message, "edge 2"));
    CHECK(contains(fit_normal({0, kInf, 2, 3}, c3, 0.0, 1.0).status.message, "edge 2"));
    CHECK(contains(fit_normal({0, 1, 2}, c3, 0.0, 1.0).status.message, "2 bins but 3"));
    CHECK(contains(fit_lognormal({-2, 0, 1, kInf}, c3, 0.0, 1.0).status.message, "Bin 1"));
    CHECK(contains(fit_exponential({-2, -1, 1, kInf}, c3, 1.0).status.message, "Bin 1"));
    CHECK_FALSE(fit_normal({0, 1}, {3}, 0.0, 1.0).status.ok);
}

TEST_CASE("degrees of freedom: grouped estimates and the Chernoff-Lehmann bracket") {
    // Fisher (1924): grouped MLE, df = k - 1 - m. Chernoff and Lehmann (1954): raw-data MLE, the
    // statistic lies between chi2(k - 1 - m) and chi2(k - 1).
    const FittedDegreesOfFreedom g = fitted_degrees_of_freedom(6, 1, EstimatedFrom::grouped_counts);
    REQUIRE(g.status.ok);
    CHECK(g.exact);
    CHECK(g.lower == 4);
    CHECK(g.upper == 4);
    const FittedDegreesOfFreedom r = fitted_degrees_of_freedom(6, 1, EstimatedFrom::raw_data);
    REQUIRE(r.status.ok);
    CHECK_FALSE(r.exact);
    CHECK(r.lower == 4);
    CHECK(r.upper == 5);
    CHECK(contains(r.note, "Chernoff"));
    CHECK(fitted_degrees_of_freedom(6, 0, EstimatedFrom::raw_data).exact);
    CHECK_FALSE(fitted_degrees_of_freedom(3, 2, EstimatedFrom::grouped_counts).status.ok);
    CHECK_FALSE(fitted_degrees_of_freedom(6, -1, EstimatedFrom::grouped_counts).status.ok);
    // p-value bracket at X2 = 5 with k = 5, m = 2: df 2 and 4. Closed forms: exp(-2.5) and
    // exp(-2.5) (1 + 2.5).
    const PValueBounds b = fitted_p_value_bounds(5.0, fitted_degrees_of_freedom(5, 2, EstimatedFrom::raw_data));
    CHECK(b.smaller.p == doctest::Approx(std::exp(-2.5)).epsilon(1e-14));
    CHECK(b.larger.p == doctest::Approx(3.5 * std::exp(-2.5)).epsilon(1e-14));
    const PValueBounds bad = fitted_p_value_bounds(5.0, fitted_degrees_of_freedom(2, 2, EstimatedFrom::raw_data));
    CHECK(std::isnan(bad.smaller.p));
    CHECK(std::isnan(bad.larger.p));
}
