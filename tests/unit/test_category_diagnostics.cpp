// Per-category diagnostics and the exact binomial test, against R 4.2 (chisq.test residuals and
// stdres, binom.test, p.adjust; tests/reference/category_diagnostics.csv and binomial_test.csv,
// made by the generate_*.py scripts beside them), mpmath for p-values below the double range,
// and closed forms worked by hand.
#include <doctest/doctest.h>

#include <cmath>
#include <cstdlib>
#include <fstream>
#include <limits>
#include <map>
#include <sstream>
#include <tuple>

#include "binomial_test.hpp"
#include "category_diagnostics.hpp"

using namespace tallyproof;

namespace {

// Rows of a reference CSV (lines starting with # skipped, first other line the header).
std::vector<std::map<std::string, std::string>> read_reference(const std::string& file) {
    std::ifstream in(std::string(TALLYPROOF_REFERENCE_DIR) + "/" + file);
    std::vector<std::map<std::string, std::string>> rows;
    std::vector<std::string> header;
    std::string line;
    while (std::getline(in, line)) {
        if (line.empty() || line[0] == '#') continue;
        std::vector<std::string> f;
        std::stringstream ss(line);
        std::string x;
        while (std::getline(ss, x, ',')) f.push_back(x);
        if (!line.empty() && line.back() == ',') f.push_back("");
        if (header.empty()) { header = f; continue; }
        std::map<std::string, std::string> row;
        for (std::size_t i = 0; i < header.size() && i < f.size(); ++i) row[header[i]] = f[i];
        rows.push_back(row);
    }
    return rows;
}

double num(const std::string& s) { return std::strtod(s.c_str(), nullptr); }

}  // namespace

TEST_CASE("binomial test against R 4.2 binom.test and mpmath") {
    const auto rows = read_reference("binomial_test.csv");
    REQUIRE(rows.size() > 50);
    for (const auto& r : rows) {
        const double x = num(r.at("x")), n = num(r.at("n")), p = num(r.at("p")), want = num(r.at("p_value"));
        CAPTURE(x);
        CAPTURE(n);
        CAPTURE(p);
        const TailProbability got = binomial_test_two_sided(x, n, p);
        // R 4.2; below 1e-300 R's double has underflowed (to 0 or a denormal such as 3e-323 for a
        // true 1e-8747), so there only the mpmath log10 column is a reference
        if (want > 1e-300) CHECK(got.p == doctest::Approx(want).epsilon(1e-11));
        else CHECK(got.p <= 1e-300);
        const std::string l = r.at("log10_p");
        if (l.empty()) continue;
        const double want_log = num(l);  // mpmath 60 digits
        if (std::isinf(want_log)) CHECK(got.log10_p == -INFINITY);
        else CHECK(got.log10_p == doctest::Approx(want_log).epsilon(1e-10).scale(1));
    }
}

TEST_CASE("binomial test closed forms") {
    // By hand: n = 10, p = 1/2, x = 0: only 0 and 10 are as unlikely: 2 / 2^10.
    CHECK(binomial_test_two_sided(0, 10, 0.5).p == doctest::Approx(2.0 / 1024).epsilon(1e-14));
    // x = n p exactly: p-value 1 (R's rule).
    CHECK(binomial_test_two_sided(5, 10, 0.5).p == 1.0);
    // p = 0 with x > 0: impossible under the null, p-value exactly 0 with log10 -inf.
    const TailProbability z = binomial_test_two_sided(2, 5, 0.0);
    CHECK(z.p == 0.0);
    CHECK(z.log10_p == -INFINITY);
    // n = 10000, p = 1/2, x = 0: 2 / 2^10000, log10 = log10 2 - 10000 log10 2.
    CHECK(binomial_test_two_sided(0, 10000, 0.5).log10_p ==
          doctest::Approx(-9999 * std::log10(2.0)).epsilon(1e-12));
    // Just above the double's underflow the value agrees with its logarithm (fuzz_engine found
    // Boost's cdf off by a factor of 5 there): n = 1000, p = 1/2, x = 0 gives 2^-999 exactly; and
    // x = 22, n = 2225, p = 0.3 gives 7.9745484732040699e-301, log10 -300.09829389775634
    // (mpmath 1.2.1 at 50 digits, summing the pmf over R's two-sided rule).
    for (double x : {0.0, 1000.0}) {
        const TailProbability t = binomial_test_two_sided(x, 1000, 0.5);
        CHECK(t.p == doctest::Approx(std::ldexp(1.0, -999)).epsilon(1e-12));
        CHECK(t.log10_p == doctest::Approx(-999 * std::log10(2.0)).epsilon(1e-13));
    }
    const TailProbability far = binomial_test_two_sided(22, 2225, 0.3);
    CHECK(far.p == doctest::Approx(7.9745484732040699e-301).epsilon(1e-12));
    CHECK(far.log10_p == doctest::Approx(-300.09829389775634).epsilon(1e-14));
}

TEST_CASE("binomial test refuses bad arguments with NaN") {
    for (auto [x, n, p] : {std::tuple<double, double, double>{11, 10, 0.5}, {-1, 10, 0.5}, {2.5, 10, 0.5},
                           {2, 10.5, 0.5}, {2, 10, 1.5}, {2, 10, -0.1}, {2, 10, NAN}, {NAN, 10, 0.5},
                           {2, INFINITY, 0.5}}) {
        CAPTURE(x);
        CAPTURE(n);
        CAPTURE(p);
        const TailProbability t = binomial_test_two_sided(x, n, p);
        CHECK(std::isnan(t.p));
        CHECK(std::isnan(t.log10_p));
    }
}

TEST_CASE("diagnostics against R 4.2 chisq.test, binom.test and p.adjust") {
    const auto rows = read_reference("category_diagnostics.csv");
    REQUIRE(rows.size() > 30);
    std::vector<std::string> order;
    std::map<std::string, std::vector<std::map<std::string, std::string>>> cases;
    for (const auto& r : rows) {
        if (!cases.count(r.at("case"))) order.push_back(r.at("case"));
        cases[r.at("case")].push_back(r);
    }
    for (const auto& name : order) {
        const auto& g = cases[name];
        CAPTURE(name);
        std::vector<double> o, e;
        std::vector<std::string> labels;
        double n = 0;
        for (const auto& r : g) n += num(r.at("observed"));
        for (const auto& r : g) {
            o.push_back(num(r.at("observed")));
            e.push_back(n * num(r.at("share")));  // as chisq.test: E = n p
            labels.push_back("c" + r.at("index"));
        }
        for (auto [method, column] : {std::pair<MultiplicityMethod, const char*>{MultiplicityMethod::holm, "holm"},
                                      {MultiplicityMethod::bonferroni, "bonferroni"},
                                      {MultiplicityMethod::benjamini_hochberg, "bh"}}) {
            CAPTURE(column);
            CategoryDiagnosticsOptions opt;
            opt.adjustment = method;
            CategoryDiagnostics d;
            const Status s = category_diagnostics(labels, o, e, opt, &d);
            REQUIRE(s.ok);
            double x2 = 0;
            for (std::size_t i = 0; i < g.size(); ++i) {
                CAPTURE(i);
                const auto& c = d.categories[i];
                const auto& r = g[i];
                // R 4.2; absolute scale 1 covers the residuals that are 0 up to rounding
                CHECK(c.pearson_residual == doctest::Approx(num(r.at("residual"))).epsilon(1e-12).scale(1));
                CHECK(c.adjusted_residual == doctest::Approx(num(r.at("stdres"))).epsilon(1e-12).scale(1));
                const double bp = num(r.at("binom_p")), ap = num(r.at(column));
                if (bp > 0) CHECK(c.binomial.p == doctest::Approx(bp).epsilon(1e-11));
                else CHECK(c.binomial.log10_p < -300);
                if (ap > 0) CHECK(c.adjusted.p == doctest::Approx(ap).epsilon(1e-11));
                else CHECK(c.adjusted.log10_p < -300);
                CHECK(c.drives_result == (ap < 0.05));
                x2 += c.contribution;
            }
            CHECK(d.statistic == doctest::Approx(x2).epsilon(1e-15));
        }
    }
}

TEST_CASE("worked example: one category too many, one too few") {
    // By hand, O = 120 80 40 60, equal shares, n = 300, E = 75 each:
    //  O - E = 45 5 -35 -15; contributions 27, 1/3, 49/3, 3; X^2 = 46.6667.
    //  Pearson residuals 45/sqrt(75) = 5.19615...; adjusted 45/sqrt(75 * 3/4) = 6.
    //  R 4.2 binom.test + p.adjust("holm") (reference CSV): 5.92e-08, 0.505, 2.79e-06, 0.0910,
    //  so categories A and C drive the result at alpha 0.05.
    CategoryDiagnostics d;
    REQUIRE(category_diagnostics({"A", "B", "C", "D"}, {120, 80, 40, 60}, {75, 75, 75, 75}, {}, &d).ok);
    CHECK(d.statistic == doctest::Approx(140.0 / 3).epsilon(1e-14));
    CHECK(d.categories[0].contribution == doctest::Approx(27).epsilon(1e-14));
    CHECK(d.categories[0].contribution_share == doctest::Approx(27 / (140.0 / 3)).epsilon(1e-14));
    CHECK(d.categories[2].difference == -35);
    CHECK(d.categories[0].observed_share == doctest::Approx(0.4).epsilon(1e-15));
    CHECK(d.categories[0].expected_share == 0.25);
    CHECK(d.categories[0].adjusted_residual == doctest::Approx(6).epsilon(1e-14));
    CHECK(d.drivers == std::vector<std::size_t>{0, 2});
    CHECK(d.categories[0].direction == "more than expected");
    CHECK(d.categories[2].direction == "fewer than expected");
    CHECK(d.categories[0].description.find("120 observed vs 75.0 expected") != std::string::npos);
    CHECK(d.categories[2].description.find("40 observed vs 75.0 expected") != std::string::npos);
    CHECK(d.summary.find("2 of 4 categories drive the result") != std::string::npos);
    CHECK(d.summary.find("Holm") != std::string::npos);
    CHECK(d.summary.find("A: more than expected") != std::string::npos);
    CHECK(d.summary.find("C: fewer than expected") != std::string::npos);
    CHECK(d.summary.find("D:") == std::string::npos);
    double shares = 0;
    for (const auto& c : d.categories) {
        shares += c.contribution_share;
        CHECK(c.goodman.lower <= c.observed_share);
        CHECK(c.goodman.upper >= c.observed_share);
        CHECK(c.sison_glaz.lower <= c.observed_share);
        CHECK(c.sison_glaz.upper >= c.observed_share);
    }
    CHECK(shares == doctest::Approx(1).epsilon(1e-14));
    CHECK(d.warnings.empty());
}

TEST_CASE("a perfect fit flags nothing and says so") {
    CategoryDiagnostics d;
    REQUIRE(category_diagnostics({"x", "y"}, {10, 30}, {10, 30}, {}, &d).ok);
    CHECK(d.statistic == 0);
    CHECK(d.drivers.empty());
    CHECK(d.categories[0].direction == "as expected");
    CHECK(d.categories[0].contribution_share == 0);
    // An expected count with rounding in it: 100 x 0.4 = 40.000000000000007 in doubles is still "as expected".
    CategoryDiagnostics r;
    REQUIRE(category_diagnostics({"x", "y"}, {40, 60}, {100 * 0.4, 100 * 0.6}, {}, &r).ok);
    CHECK(r.categories[0].direction == "as expected");
    CHECK(d.categories[0].binomial.p == 1.0);
    CHECK(d.summary.find("No single category") != std::string::npos);
}

TEST_CASE("p-values below the double range still rank and flag") {
    // R 4.2 gives binom.test(900, 1000, 0.2)$p.value = 0 (underflow); mpmath: log10 = -498.95.
    CategoryDiagnostics d;
    REQUIRE(category_diagnostics({"a", "b", "c"}, {900, 50, 50}, {200, 400, 400}, {}, &d).ok);
    CHECK(d.categories[0].binomial.log10_p == doctest::Approx(-498.94662405738977).epsilon(1e-10));
    // Holm, m = 3: the smallest p is multiplied by 3.
    CHECK(d.categories[0].adjusted.log10_p == doctest::Approx(-498.94662405738977 + std::log10(3.0)).epsilon(1e-10));
    CHECK(d.categories[0].drives_result);
    CHECK(d.categories[0].description.find("10⁻") != std::string::npos);  // written from log10, not "0"
}

TEST_CASE("bad arguments are refused") {
    CategoryDiagnostics d;
    CategoryDiagnosticsOptions opt;
    CHECK_FALSE(category_diagnostics({"a"}, {3}, {3}, opt, &d).ok);
    CHECK_FALSE(category_diagnostics({"a", "b"}, {3, 4}, {3, 4, 0}, opt, &d).ok);
    CHECK_FALSE(category_diagnostics({"a"}, {3, 4}, {3, 4}, opt, &d).ok);
    Status s = category_diagnostics({"a", "b"}, {3, 4}, {7, 0}, opt, &d);
    CHECK_FALSE(s.ok);
    CHECK(s.message.find("\"b\"") != std::string::npos);
    CHECK_FALSE(category_diagnostics({"a", "b"}, {3, 4.5}, {3.75, 3.75}, opt, &d).ok);
    CHECK_FALSE(category_diagnostics({"a", "b"}, {3, -4}, {3, 4}, opt, &d).ok);
    CHECK_FALSE(category_diagnostics({"a", "b"}, {3, 4}, {3, NAN}, opt, &d).ok);
    CHECK_FALSE(category_diagnostics({"a", "b"}, {0, 0}, {1, 1}, opt, &d).ok);
    s = category_diagnostics({"a", "b"}, {3, 4}, {5, 5}, opt, &d);  // totals 7 vs 10
    CHECK_FALSE(s.ok);
    CHECK(s.message.find("must agree") != std::string::npos);
    for (double alpha : {0.0, 1.0, -0.5, std::numeric_limits<double>::quiet_NaN()}) {
        opt.alpha = alpha;
        CHECK_FALSE(category_diagnostics({"a", "b"}, {3, 4}, {3.5, 3.5}, opt, &d).ok);
    }
    CHECK(d.categories.empty());
}

TEST_CASE("adjusted residuals stay finite when one cell holds almost all the expected count") {
    // Found by fuzz_engine: an expected share within rounding of 1 made 1 - p = 0 and the
    // adjusted residual 0/0. With two cells the two adjusted residuals are equal and opposite in
    // exact arithmetic (common practice: (O - E) sums to 0 and E(1 - p) is the same for both).
    CategoryDiagnostics d;
    const double tiny = 1.9116391452262784e-16;
    REQUIRE(category_diagnostics({"x", "y"}, {9, 0}, {9 - tiny, tiny}, {}, &d).ok);
    for (const auto& c : d.categories) {
        CAPTURE(c.label);
        CHECK(std::isfinite(c.adjusted_residual));
        CHECK(std::fabs(c.adjusted_residual) < 1e-7);  // sqrt(tiny): both are negligible
    }
}
