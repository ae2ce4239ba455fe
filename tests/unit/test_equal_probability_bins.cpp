// Equal-probability bins under a fitted normal, lognormal or exponential model. Every edge is
// checked against SciPy 1.10.1 with NumPy 1.24.2 (Debian's /usr/bin/python3): the estimates are
// numpy.mean and numpy.std (ddof=0, the maximum likelihood sd), 1/numpy.mean for the rate; the
// edges scipy.stats.norm.ppf(i/K, mean, sd), scipy.stats.lognorm.ppf(i/K, sdlog,
// scale=exp(meanlog)) and scipy.stats.expon.ppf(i/K, scale=1/rate); the counts
// numpy.histogram with those edges. The values are written by the test itself.
#include <doctest/doctest.h>

#include <cmath>
#include <string>

#include "equal_probability_bins.hpp"
#include "paste_parser.hpp"
#include "pasted_analysis.hpp"
#include "pvalue_job.hpp"

using namespace tallyproof;
using D = std::vector<double>;
using S = std::vector<std::string>;

namespace {

ParseOptions equal_probability(int k, std::optional<ModelKind> model = std::nullopt,
                               std::vector<std::pair<std::string, double>> given = {}) {
    ParseOptions o;
    o.bins.kind = BinChoice::Kind::equal_probability;
    o.bins.bins = k;
    o.bins.model = model;
    o.bins.parameters = std::move(given);
    return o;
}

bool has_note(const ParsedInput& p, const std::string& text) {
    for (const auto& n : p.notes)
        if (n == text) return true;
    return false;
}

void check_edges(const D& got, const D& want) {
    REQUIRE(got.size() == want.size());
    for (std::size_t i = 0; i < want.size(); ++i) {
        if (std::isinf(want[i])) CHECK(got[i] == want[i]);
        else CHECK(got[i] == doctest::Approx(want[i]).epsilon(1e-13));
    }
}

}  // namespace

TEST_CASE("equal-probability bins under the normal model: edges at its quantiles i/K") {
    const ParsedInput p = parse_input("4.1\n5.3\n6.0\n4.8\n5.5\n7.2\n3.9\n5.1\n6.6\n4.4\n", equal_probability(4));
    REQUIRE(p.status.ok);
    CHECK(p.shape == InputShape::raw_bins);
    // SciPy: mean 5.29, numpy.std 1.0163168797181321; norm.ppf([1/4, 2/4, 3/4], 5.29, 1.0163168797181321)
    check_edges(p.edges, {-HUGE_VAL, 4.604504681678856, 5.29, 5.975495318321144, HUGE_VAL});
    CHECK(p.observed == D{3, 2, 2, 3});  // numpy.histogram with those edges
    CHECK(p.categories == S{"[-inf, 4.6045)", "[4.6045, 5.29)", "[5.29, 5.9755)", "[5.9755, inf)"});
    REQUIRE(p.bin_model);
    CHECK(*p.bin_model == ModelKind::normal);
    CHECK(has_note(p, "No continuous model was chosen, so the equal-probability bins are placed under the normal model "
                      "(lognormal and exponential can be chosen instead)."));
    CHECK(has_note(p, "4 bins of equal probability 1/4 under the normal model with mean 5.29 and sd 1.01632 estimated "
                      "from the 10 raw values by maximum likelihood: the inner edges are its quantiles i/4."));
}

TEST_CASE("equal-probability bins under the lognormal and exponential models start at 0") {
    ParsedInput p = parse_input("0.8\n1.9\n2.4\n3.1\n5.0\n0.5\n12.0\n1.2\n", equal_probability(3, ModelKind::lognormal));
    REQUIRE(p.status.ok);
    // SciPy: meanlog 0.751137515269912, sdlog 0.9535047708993286 (mean and numpy.std of numpy.log);
    // lognorm.ppf([1/3, 2/3], 0.9535047708993286, scale=exp(0.751137515269912))
    check_edges(p.edges, {0, 1.4055616593312723, 3.195801925091577, HUGE_VAL});
    CHECK(p.observed == D{3, 3, 2});  // numpy.histogram
    p = parse_input("0\n0.7\n1.3\n2.2\n4.5\n0.2\n3.1\n9.0\n", equal_probability(5, ModelKind::exponential));
    REQUIRE(p.status.ok);
    // SciPy: expon.ppf([1/5, ..., 4/5], scale=numpy.mean = 2.625)
    check_edges(p.edges, {0, 0.5857518221998006, 1.3409172623857257, 2.405263171169657, 4.224774520139514, HUGE_VAL});
    CHECK(p.observed == D{2, 2, 1, 1, 2});  // numpy.histogram; the value 0 is in the first bin
    CHECK(has_note(p, "5 bins of equal probability 1/5 under the exponential model with rate 0.380952 estimated from the "
                      "8 raw values by maximum likelihood: the inner edges are its quantiles i/5."));
}

TEST_CASE("equal-probability edges: given parameters, many bins, far quantiles") {
    RawMoments m;
    for (double x : {48.0, 52.0}) m.add(x);  // mean 50, ML sd 2 (closed form)
    CHECK(m.mean == 50);
    CHECK(m.m2 == 8);
    EqualProbabilityBins b = equal_probability_bins(ModelKind::normal, m, {{"sd", 12}}, 1000);
    REQUIRE(b.status.ok);
    REQUIRE(b.edges.size() == 1001);
    // SciPy: norm.ppf(i/1000, 50, 12) for i = 1, 500, 999 (norm.isf(1/1000, 50, 12) agrees)
    CHECK(b.edges[1] == doctest::Approx(12.917212325986242).epsilon(1e-13));
    CHECK(b.edges[500] == doctest::Approx(50.0).epsilon(1e-13));
    CHECK(b.edges[999] == doctest::Approx(87.08278767401376).epsilon(1e-13));
    CHECK(b.parameters[0].estimated);
    CHECK_FALSE(b.parameters[1].estimated);
    b = equal_probability_bins(ModelKind::normal, m, {{"mean", 0}, {"sd", 1}}, 4);
    REQUIRE(b.status.ok);
    check_edges(b.edges, {-HUGE_VAL, -0.6744897501960817, 0, 0.6744897501960817, HUGE_VAL});  // SciPy norm.ppf(0.25)
    CHECK(b.note == "4 bins of equal probability 1/4 under the normal model with mean 0 and sd 1 (given): the inner edges "
                    "are its quantiles i/4.");
    b = equal_probability_bins(ModelKind::normal, m, {{"mean", 46}}, 2);  // ML sd about a given mean: sqrt(4 + 16)
    REQUIRE(b.status.ok);
    CHECK(b.parameters[1].value == doctest::Approx(std::sqrt(20.0)).epsilon(1e-15));
    b = equal_probability_bins(ModelKind::exponential, m, {{"rate", 0.5}}, 3);
    REQUIRE(b.status.ok);
    check_edges(b.edges, {0, 0.8109302162163285, 2.197224577336219, HUGE_VAL});  // SciPy expon.ppf([1/3, 2/3], scale=2)
    b = equal_probability_bins(ModelKind::lognormal, m, {{"meanlog", 1}, {"sdlog", 0.5}}, 4);
    REQUIRE(b.status.ok);
    // SciPy lognorm.ppf([1/2, 3/4], 0.5, scale=exp(1))
    CHECK(b.edges[2] == doctest::Approx(2.718281828459045).epsilon(1e-13));
    CHECK(b.edges[3] == doctest::Approx(3.808536044832714).epsilon(1e-13));
}

TEST_CASE("equal-probability bins reach the test as the fitted model with explicit edges") {
    Analysis a;
    const ParsedInput p = parse_input("4.1\n5.3\n6.0\n4.8\n5.5\n7.2\n3.9\n5.1\n6.6\n4.4\n", equal_probability(4));
    REQUIRE(p.status.ok);
    CHECK(apply_pasted_input(p, &a));
    CHECK(a.model.kind == ModelKind::normal);
    CHECK(a.model.edges == p.edges);
    const Result r = analyse_completely(a);
    REQUIRE(r.status.ok);
    CHECK(r.estimated_parameters == 2);
    CHECK(r.df == 1);  // k - 1 - m with grouped maximum likelihood (Fisher 1924; Moore and Spruill 1975)
    double total = 0;
    for (double e : r.expected_counts) total += e;
    CHECK(total == doctest::Approx(10).epsilon(1e-12));
}

TEST_CASE("equal-probability bins: refusals name the model, the line and the cell") {
    ParsedInput p = parse_input("1.5\n2\n0\n4\n", equal_probability(3, ModelKind::lognormal));
    CHECK(p.status.message == "Line 3, column 1: \"0\" is not above 0; the lognormal model needs positive values.");
    CHECK(p.status.line == 3);
    p = parse_input("1.5\n2\n-3\n4\n", equal_probability(3, ModelKind::exponential));
    CHECK(p.status.message == "Line 3, column 1: \"-3\" is negative; the exponential model needs values of 0 or more.");
    p = parse_input("1\n2\n3\n", equal_probability(3, ModelKind::poisson));
    CHECK(p.status.message ==
          "Equal-probability bins are placed at the quantiles of a normal, lognormal or exponential model; the poisson "
          "model is not one of these. Choose one of them, or give bin edges (such as 0,10,20,inf) or equal widths (equal:K).");
    p = parse_input("1\n2\n3\n", equal_probability(1));
    CHECK(p.status.message == "Equal-probability bins: expected a number of bins from 2 to 1000, got 1.");
    p = parse_input("1\n2\n3\n", equal_probability(1001));
    CHECK(p.status.message == "Equal-probability bins: expected a number of bins from 2 to 1000, got 1001.");
    p = parse_input("2\n2\n2\n", equal_probability(3));
    CHECK(p.status.message == "All 3 values are 2: the normal model fitted to them has sd 0, so it cannot place "
                              "equal-probability bins; they need a spread of values.");
    p = parse_input("0\n0\n", equal_probability(3, ModelKind::exponential));
    CHECK(p.status.message == "All 2 values are 0: the exponential model fitted to them has no positive mean, so it "
                              "cannot place equal-probability bins.");
    p = parse_input("1\n2\n", equal_probability(3, ModelKind::normal, {{"sd", -1}}));
    CHECK(p.status.message == "The normal model's sd must be a positive number; -1 was given.");
    p = parse_input("1\nx\n", equal_probability(3));
    CHECK(p.status.message == "Line 2, column 1: \"x\" is not a number; expected a measurement.");
    // sd 1e-12 about 1e6: neighbouring quantiles coincide in double precision
    p = parse_input("1000000\n1000000.000000000001\n", equal_probability(3, ModelKind::normal, {{"sd", 1e-12}}));
    CHECK(p.status.message.find("cannot be told apart in double precision") != std::string::npos);
}
