// Comparison with a previous sample (model kind reference-sample): the 2 x k test of homogeneity
// against SciPy 1.10 chi2_contingency and R 4.2 chisq.test (tests/reference/reference_sample.csv),
// the exact conditional p-value against a brute-force enumeration written here, Monte Carlo
// against that exact value, merging of both rows, and the refusals.
#include <doctest/doctest.h>

#include <cmath>
#include <functional>
#include <string>
#include <vector>

#include "analysis_document.hpp"
#include "goodness_of_fit.hpp"
#include "exact_homogeneity.hpp"
#include "homogeneity_table.hpp"
#include "pvalue_job.hpp"
#include "reference_csv.hpp"
#include "report.hpp"
#include "writeup.hpp"

using namespace tallyproof;
using tallyproof_test::reference_rows;
using tallyproof_test::split_numbers;

namespace {

Analysis comparison(const std::vector<double>& current, const std::vector<double>& previous) {
    Analysis a;
    for (std::size_t i = 0; i < current.size(); ++i) a.categories.push_back("C" + std::to_string(i + 1));
    a.observed = current;
    a.model.kind = ModelKind::reference_sample;
    a.model.values = previous;
    return a;
}

// Brute force: every current row x with 0 <= x_j <= c_j and sum r1, its hypergeometric
// probability prod C(c_j, x_j) / C(N, r1) and its Pearson X² over both rows.
double brute_force_p(const std::vector<int>& cur, const std::vector<int>& prev) {
    const std::size_t k = cur.size();
    int r1 = 0, n = 0;
    std::vector<int> c(k);
    for (std::size_t j = 0; j < k; ++j) { c[j] = cur[j] + prev[j]; r1 += cur[j]; n += c[j]; }
    auto choose = [](int a, int b) { double v = 1; for (int i = 1; i <= b; ++i) v = v * (a - b + i) / i; return v; };
    auto x2 = [&](const std::vector<int>& x) {
        double s = 0;
        for (std::size_t j = 0; j < k; ++j) {
            const double e1 = double(r1) * c[j] / n, e2 = double(n - r1) * c[j] / n;
            s += (x[j] - e1) * (x[j] - e1) / e1 + (c[j] - x[j] - e2) * (c[j] - x[j] - e2) / e2;
        }
        return s;
    };
    const double observed = x2(cur), total = choose(n, r1);
    double p = 0;
    std::vector<int> x(k, 0);
    std::function<void(std::size_t)> visit = [&](std::size_t j) {
        if (j == k) {
            int s = 0;
            for (int v : x) s += v;
            if (s != r1) return;
            if (x2(x) >= observed * (1 - 1e-9)) {
                double w = 1;
                for (std::size_t i = 0; i < k; ++i) w *= choose(c[i], x[i]);
                p += w / total;
            }
            return;
        }
        for (x[j] = 0; x[j] <= c[j]; ++x[j]) visit(j + 1);
    };
    visit(0);
    return p;
}

}  // namespace

TEST_CASE("reference_sample.csv: statistic, p, expected counts and adjusted residuals (SciPy 1.10, R 4.2)") {
    int rows = 0;
    for (const auto& f : reference_rows("reference_sample.csv")) {
        REQUIRE(f.size() == 13);
        CAPTURE(f[0]);
        const std::vector<double> cur = split_numbers(f[0]), prev = split_numbers(f[1]);
        const Result r = analyse(comparison(cur, prev));
        REQUIRE(r.status.ok);
        REQUIRE(r.reference);
        CHECK(r.df == doctest::Approx(double(cur.size() - 1)));
        CHECK(r.statistic == doctest::Approx(std::stod(f[2])).epsilon(1e-10));  // SciPy chi2_contingency
        CHECK(r.p.p == doctest::Approx(std::stod(f[3])).epsilon(1e-10));         // SciPy chi2_contingency
        const std::vector<double> expected = split_numbers(f[4]), stdres = split_numbers(f[5]);
        REQUIRE(r.tested_expected.size() == expected.size());
        for (std::size_t j = 0; j < expected.size(); ++j) {
            CHECK(r.tested_expected[j] == doctest::Approx(expected[j]).epsilon(1e-12));
            CHECK(r.reference->adjusted_residuals[j] == doctest::Approx(stdres[j]).epsilon(1e-10).scale(1e-2));  // R stdres
            CHECK(r.diagnostics.categories[j].adjusted_residual == doctest::Approx(stdres[j]).epsilon(1e-10).scale(1e-2));
        }
        double total = 0;
        for (double v : r.contributions) total += v;
        CHECK(total == doctest::Approx(r.statistic).epsilon(1e-12));
        // R 4.2 chisq.test(m, correct = FALSE): the same statistic, p and expected row.
        CHECK(r.statistic == doctest::Approx(std::stod(f[6])).epsilon(1e-10));  // R chisq.test
        CHECK(r.p.p == doctest::Approx(std::stod(f[7])).epsilon(1e-10));        // R chisq.test
        const std::vector<double> r_expected = split_numbers(f[8]);
        REQUIRE(r_expected.size() == r.tested_expected.size());
        for (std::size_t j = 0; j < r_expected.size(); ++j)
            CHECK(r.tested_expected[j] == doctest::Approx(r_expected[j]).epsilon(1e-12));  // R chisq.test $expected
        // Effect size over both samples, as in the one-sample path: w, the chance-corrected
        // estimate and the 95% interval (SciPy ncx2 roots), each with its Cohen (1988) label.
        CHECK(r.effect.w == doctest::Approx(std::stod(f[9])).epsilon(1e-12));
        CHECK(r.effect.estimate == doctest::Approx(std::stod(f[10])).epsilon(1e-12));
        CHECK(r.effect.w_interval.estimate == r.effect.estimate);
        CHECK(r.effect.w_interval.lower == doctest::Approx(std::stod(f[11])).epsilon(1e-7).scale(1e-9));  // SciPy ncx2.sf root
        CHECK(r.effect.w_interval.upper == doctest::Approx(std::stod(f[12])).epsilon(1e-7));             // SciPy ncx2.cdf root
        const double est = std::stod(f[10]);  // Cohen 1988: .1 small, .3 medium, .5 large
        const std::string want = est < 0.1 ? "very small" : est < 0.3 ? "small" : est < 0.5 ? "medium" : "large";
        CHECK(r.effect.label == want);
        CHECK(r.effect.w_label == std::string(std::stod(f[9]) < 0.1 ? "very small" : std::stod(f[9]) < 0.3 ? "small"
                                              : std::stod(f[9]) < 0.5 ? "medium" : "large"));
        ++rows;
    }
    CHECK(rows >= 7);
}

TEST_CASE("exact conditional p on both margins equals a brute-force enumeration") {
    const std::vector<std::pair<std::vector<int>, std::vector<int>>> tables = {
        {{8, 2}, {3, 9}}, {{3, 0, 7, 2}, {5, 4, 2, 6}}, {{4, 4, 4}, {4, 4, 4}}, {{1, 6, 0, 2, 3}, {2, 1, 4, 0, 5}},
        {{12, 5, 9}, {20, 14, 3}}, {{0, 1}, {5, 0}}};
    for (const auto& [cur, prev] : tables) {
        const std::vector<double> c(cur.begin(), cur.end()), p(prev.begin(), prev.end());
        HomogeneityTable t;
        REQUIRE(homogeneity_table(c, p, 1.0, &t).ok);
        HomogeneityExactResult e;
        REQUIRE(homogeneity_exact_p(t, 1.0, 1e7, &e).ok);
        const double brute = brute_force_p(cur, prev);
        CAPTURE(brute);
        CHECK(e.p.p == doctest::Approx(brute).epsilon(1e-11));
        CHECK(e.tables == doctest::Approx(homogeneity_table_count(t)));
        // Through the analysis: the decision uses the exact p.
        Analysis a = comparison(c, p);
        a.pvalue.method = PValueMethod::exact;
        const Result r = analyse_completely(a);
        REQUIRE(r.status.ok);
        CHECK(r.exact.computed);
        CHECK(r.method == PValueMethod::exact);
        CHECK(r.p.p == doctest::Approx(brute).epsilon(1e-11));
    }
}

TEST_CASE("Monte Carlo agrees with the exact conditional p within four standard errors, and repeats by seed") {
    const std::vector<double> cur = {12, 5, 9}, prev = {20, 14, 3};
    HomogeneityTable t;
    REQUIRE(homogeneity_table(cur, prev, 1.0, &t).ok);
    HomogeneityExactResult e;
    REQUIRE(homogeneity_exact_p(t, 1.0, 1e7, &e).ok);
    MonteCarloResult m1, m2;
    REQUIRE(homogeneity_monte_carlo_p(t, 1.0, 40000, 11, 1e9, &m1).ok);
    REQUIRE(homogeneity_monte_carlo_p(t, 1.0, 40000, 11, 1e9, &m2).ok);
    CHECK(m1.extreme == m2.extreme);
    CHECK(std::fabs(m1.p - e.p.p) < 4 * m1.standard_error);
    Analysis a = comparison(cur, prev);
    a.pvalue.method = PValueMethod::monte_carlo;
    a.pvalue.replicates = 20000;
    const Result r = analyse_completely(a);  // the job of pvalue_job must leave this p alone
    REQUIRE(r.status.ok);
    CHECK(r.method == PValueMethod::monte_carlo);
    CHECK(r.monte_carlo.replicates == 20000);
    CHECK(std::fabs(r.p.p - e.p.p) < 4 * r.monte_carlo.standard_error);
}

TEST_CASE("large tables: the exact p is refused with a pointer to Monte Carlo, and Monte Carlo beyond its limit") {
    Analysis a = comparison({150, 420, 190, 40}, {140, 390, 230, 40});
    a.pvalue.method = PValueMethod::exact;
    Result r = analyse_completely(a);
    REQUIRE(r.status.ok);
    CHECK_FALSE(r.exact.computed);
    CHECK(r.exact.refusal.find("Monte Carlo") != std::string::npos);
    CHECK(r.method == PValueMethod::asymptotic);
    a.pvalue.method = PValueMethod::monte_carlo;
    a.pvalue.replicates = 1000000000;
    r = analyse_completely(a);
    CHECK_FALSE(r.monte_carlo.computed);
    CHECK(r.monte_carlo.refusal.find("asymptotic") != std::string::npos);
}

TEST_CASE("merging of thin categories applies to both rows together") {
    // Hand check: the last two categories are thin in the smaller (current) row and merge there.
    Analysis a = comparison({30, 40, 4, 2}, {300, 420, 40, 25});
    a.ordered = true;
    a.merge.rule = MergeRule::all_at_least_5;
    const Result r = analyse(a);
    REQUIRE(r.status.ok);
    CHECK(r.merged);
    REQUIRE(r.tested_categories.size() == 3);
    CHECK(r.tested_observed[2] == 6);
    CHECK(r.reference->tested_reference[2] == 65);
    for (double e : r.tested_expected) CHECK(e >= 5);
    // The same test as on the merged counts entered directly.
    const Result m = analyse(comparison({30, 40, 6}, {300, 420, 65}));
    CHECK(r.statistic == doctest::Approx(m.statistic).epsilon(1e-12));
    CHECK(r.df == 2);
}

TEST_CASE("bad reference samples are refused with messages naming the problem") {
    Result r = analyse(comparison({10, 20, 30}, {10, 20}));
    CHECK_FALSE(r.status.ok);
    CHECK(r.status.message.find("previous sample has 2 counts but there are 3") != std::string::npos);
    r = analyse(comparison({10, 20, 30}, {0, 0, 0}));
    CHECK_FALSE(r.status.ok);
    CHECK(r.status.message.find("All counts of the previous sample are zero") != std::string::npos);
    r = analyse(comparison({10, 20, 30}, {0.2, 0.3, 0.5}));
    CHECK_FALSE(r.status.ok);
    CHECK(r.status.message.find("whole number") != std::string::npos);
    r = analyse(comparison({0, 20, 30}, {0, 10, 5}));  // a category empty in both is left out
    REQUIRE(r.status.ok);
    CHECK(r.tested_categories.size() == 2);
    CHECK(r.df == 1);
}

TEST_CASE("document, report and write-up of a comparison with a previous sample") {
    Analysis a;
    REQUIRE(read_analysis_document(R"({"categories":["A","B","C","D"],"observed":[150,420,190,40],)"
                                   R"("model":{"kind":"reference-sample","values":[140,390,230,40]}})", &a).ok);
    CHECK(a.model.kind == ModelKind::reference_sample);
    Analysis back;
    REQUIRE(read_analysis_document(write_analysis_document(a), &back).ok);
    CHECK(back.model.kind == ModelKind::reference_sample);
    CHECK(back.model.values == a.model.values);
    const Result r = analyse(a);
    REQUIRE(r.status.ok);
    const std::string sentence = writeup_sentence(a, r, WriteupOptions{});
    CHECK(sentence.find("compared with the previous sample of N = 800") != std::string::npos);
    CHECK(sentence.find("N = 1,600") != std::string::npos);
    CHECK(report_json(a, r).find("\"reference_sample\":{") != std::string::npos);
    CHECK(verdict_sentence(r).find("previous sample") != std::string::npos);
    // The effect-size line once read "w = 0.000 (, corrected for chance)": the estimate and its
    // label were left unset on this path. X² = 5.2655 (SciPy, reference_sample.csv row 1), df 3,
    // N = 1600: sqrt((X² - 3)/1600) = 0.0376, very small (Cohen 1988); sqrt(df/N) = 0.043.
    const std::string text = report_text(a, r);
    CHECK(text.find("(, ") == std::string::npos);
    CHECK(text.find("Effect size: w = 0.038 (very small, corrected for chance), 95% CI [0.000, 0.098]") != std::string::npos);
    CHECK(text.find("averages about √(df/N) = 0.043") != std::string::npos);
    CHECK(sentence.find("w = 0.04") != std::string::npos);
}
