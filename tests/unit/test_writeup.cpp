// Results write-up: the reporting style (common practice, APA-like: statistic to two decimals,
// p to three decimals without leading zero, "p < .001" below that), wording, method, merging
// notes, Markdown escaping and the TSV block. Numbers come from R 4.2 as named beside them.
#include <doctest/doctest.h>

#include <cmath>
#include <string>

#include "goodness_of_fit.hpp"
#include "writeup.hpp"

using namespace tallyproof;

namespace {

// x = (30, 20, 10, 40), equal shares, N = 100. R 4.2: chisq.test(x, p = rep(.25, 4)) gives
// X-squared = 20, df = 3, p-value = 0.0001697424356; w = sqrt(20/100) = 0.4472136 (closed form);
// 95% CI of w by uniroot on pchisq(20, 3, ncp) at 0.025 each side: [0.2195227538, 0.6242481428].
// Adjusted residuals (chisq.test()$stdres): 0, -1.732051, -3.464102, 3.464102.
Result sample() {
    Result r;
    r.categories = r.tested_categories = {"A", "B", "C", "D"};
    r.observed = r.tested_observed = {30, 20, 10, 40};
    r.expected_counts = r.tested_expected = {25, 25, 25, 25};
    r.contributions = {1, 1, 9, 9};
    r.n = 100;
    r.lambda = 1;
    r.statistic = 20;
    r.df = 3;
    r.p = r.upper = {0.0001697424356, std::log10(0.0001697424356)};
    r.alpha = 0.05;
    r.reject = true;
    r.effect.w = 0.4472136;              // sqrt(20 / 100)
    r.effect.estimate = 0.4123105626;    // sqrt((20 - 3) / 100), the labelled size the sentence gives
    r.lower = {0.9998302575644, std::log10(0.9998302575644)};  // R: pchisq(20, 3)
    r.effect.w_interval = {0.4123105626, 0.2195227538, 0.6242481428, 0.95};
    r.validity.cochran_holds = true;
    for (std::size_t i = 0; i < 4; ++i) r.merge_map.push_back({i});
    const double ares[] = {0, -1.732051, -3.464102, 3.464102};
    const char* dir[] = {"as expected", "fewer than expected", "fewer than expected", "more than expected"};
    for (int i = 0; i < 4; ++i) {
        CategoryDiagnostic d;
        d.adjusted_residual = ares[i];
        d.adjusted = {i == 2 || i == 3 ? 0.0004 : 0.5, 0};  // placeholders: only their writing is tested
        d.direction = dir[i];
        r.diagnostics.categories.push_back(d);
    }
    return r;
}

}  // namespace

TEST_CASE("the sentence in reporting style") {
    Analysis a;
    Result r = sample();
    WriteupOptions o;
    o.subject = "the grades";
    CHECK(writeup_sentence(a, r, o) ==
          "A chi-square goodness-of-fit test found that the grades were not consistent with the stated mix, "
          "χ²(3, N = 100) = 20.00, p < .001, w = 0.41, 95% CI [0.22, 0.62] (asymptotic).");

    // p = .019: three decimals, no leading zero (X2 = 10 on 3 df, R: 0.01856613546).
    r.statistic = 10;
    r.p = {0.01856613546, std::log10(0.01856613546)};
    r.method = PValueMethod::exact;
    CHECK(writeup_sentence(a, r, o).find("= 10.00, p = .019, w = 0.41") != std::string::npos);
    CHECK(writeup_sentence(a, r, o).find("(exact).") != std::string::npos);

    r.method = PValueMethod::monte_carlo;
    r.monte_carlo.replicates = 100000;
    r.monte_carlo.seed = 7;
    CHECK(writeup_sentence(a, r, o).find("(Monte Carlo, 100,000 replicates, seed 7).") != std::string::npos);

    // Not rejected: "no evidence against", never "consistent with" or "proves"; a non-default alpha is named.
    r.reject = false;
    r.alpha = 0.01;
    const std::string s = writeup_sentence(a, r, o);
    CHECK(s.rfind("A chi-square goodness-of-fit test found no evidence against the stated mix for the grades at α = .01, χ²(3", 0) == 0);
    CHECK(s.find("prove") == std::string::npos);
    r.p = {0.9996, -0.0002};
    CHECK(writeup_sentence(a, r, o).find("p > .999") != std::string::npos);  // common practice near 1
}

TEST_CASE("the statistic's own symbol") {
    CHECK(statistic_symbol(1) == "χ²");
    CHECK(statistic_symbol(0) == "G²");
    CHECK(statistic_symbol(-0.5) == "T²");
    CHECK(statistic_symbol(-1) == "GM²");
    CHECK(statistic_symbol(-2) == "NM²");
    CHECK(statistic_symbol(2.0 / 3) == "CR");
    Analysis a;
    Result r = sample();
    r.lambda = 0;
    r.williams_q = 1.0125;
    const std::string s = writeup_sentence(a, r, {});
    CHECK(s.rfind("A likelihood-ratio goodness-of-fit test with Williams' correction found that the counts were not consistent", 0) == 0);
    CHECK(s.find("G²(3, N = 100) = 20.00") != std::string::npos);
    r.lambda = 2.0 / 3;
    CHECK(writeup_sentence(a, r, {}).rfind("A Cressie-Read power-divergence goodness-of-fit test (λ = 0.667) found", 0) == 0);
}

TEST_CASE("decimal comma") {
    Analysis a;
    Result r = sample();
    r.n = 12345;  // grouping: narrow no-break space with a decimal comma, comma otherwise (APA 6.38)
    r.statistic = 12.8449;
    r.p = {0.005, std::log10(0.005)};
    r.method = PValueMethod::monte_carlo;
    r.monte_carlo.replicates = 100000;
    r.monte_carlo.seed = 7;
    WriteupOptions o;
    o.decimal_comma = true;
    CHECK(writeup_sentence(a, r, o) ==
          "A chi-square goodness-of-fit test found that the counts were not consistent with the stated mix, "
          "χ²(3, N = 12\u202F345) = 12,84; p = ,005; w = 0,41; 95% CI [0,22; 0,62] (Monte Carlo; 100\u202F000 replicates; seed 7).");
    o.decimal_comma = false;
    CHECK(writeup_sentence(a, r, o).find("χ²(3, N = 12,345) = 12.84, p = .005,") != std::string::npos);
}

TEST_CASE("notes: merging, estimated parameters, small expected counts") {
    Analysis a;
    a.merge.rule = MergeRule::all_at_least_5;
    Result r = sample();
    r.categories = {"0", "1", "2", "3", "4", "5 or more"};
    r.merged = true;
    r.merge_map = {{0}, {1}, {2, 3}, {4, 5}};
    r.tested_categories = {"0", "1", "2–3", "4–5 or more"};
    std::string s = writeup(a, r, {});
    CHECK(s.find("Categories were merged in 2 groups (2 and 3; 4 and 5 or more) so that every expected count is at least 5.") != std::string::npos);
    r.merge_map = {{0}, {1}, {2}, {3}, {4, 5}};
    s = writeup(a, r, {});
    CHECK(s.find("\nCategories 4 and 5 or more were merged so that every expected count is at least 5.\n") != std::string::npos);
    a.merge.rule = MergeRule::cochran;
    CHECK(writeup(a, r, {}).find("so that no expected count is below 1 and at most 20% are below 5 (Cochran's rule).") != std::string::npos);

    r.estimated_parameters = 1;
    r.model_description = "Poisson, mean estimated 0.6100";
    a.model.kind = ModelKind::poisson;
    s = writeup(a, r, {});
    CHECK(s.find("The expected counts come from a fitted model (Poisson, mean estimated 0.6100); 1 parameter was estimated, "
                 "so df = 4 − 1 − 1 = 3.") != std::string::npos);  // df = k - 1 - m (Fisher 1924), with k = 4 tested cells
    CHECK(s.find("were not consistent with the fitted model, χ²(") != std::string::npos);
    a.model.kind = ModelKind::equal;

    r.validity.cochran_holds = false;
    r.validity.min_expected = 0.8;
    CHECK(writeup(a, r, {}).find("the smallest is 0.80") != std::string::npos);
    r.method = PValueMethod::exact;
    CHECK(writeup(a, r, {}).find("the smallest is") == std::string::npos);  // exact p: no caution needed

    r.method = PValueMethod::asymptotic;
    r.exact.requested = true;
    r.exact.refusal = "too costly";
    CHECK(writeup(a, r, {}).find("An exact p-value was not computed (too costly); the p-value shown is asymptotic.") != std::string::npos);
}

TEST_CASE("Markdown: sentence and an escaped table") {
    Analysis a;
    Result r = sample();
    r.tested_categories = {"A", "a|b", "*bold* <script>alert(1)</script>", "[x](javascript:y)\nz"};
    WriteupOptions o;
    o.style = WriteupStyle::markdown;
    o.subject = "the <b>grades</b>";
    const std::string s = writeup(a, r, o);
    CHECK(s.find("found that the \\<b\\>grades\\</b\\> were not consistent") != std::string::npos);
    CHECK(s.find("| Category | Observed | Expected | Contribution | Adjusted residual | Adjusted p | Direction |\n|:--|--:|--:|--:|--:|--:|:--|\n") !=
          std::string::npos);
    CHECK(s.find("| A | 30 | 25.00 | 1.00 | 0.00 | .500 | as expected |\n") != std::string::npos);
    CHECK(s.find("| a\\|b | 20 | 25.00 | 1.00 | -1.73 | .500 | fewer than expected |\n") != std::string::npos);
    CHECK(s.find("| \\*bold\\* \\<script\\>alert\\(1\\)\\</script\\> | 10 | 25.00 | 9.00 | -3.46 | < .001 |") != std::string::npos);
    CHECK(s.find("| \\[x\\]\\(javascript:y\\) z | 40 |") != std::string::npos);
    CHECK(s.find("<script>") == std::string::npos);
    CHECK(s.find("95% CI \\[0.22, 0.62\\]") != std::string::npos);
    std::size_t rows = 0;
    for (std::size_t p = s.find("\n|"); p != std::string::npos; p = s.find("\n|", p + 1)) ++rows;
    CHECK(rows == 6);  // header, rule, 4 categories: no label broke a row
}

TEST_CASE("TSV block pastes into cells") {
    Analysis a;
    Result r = sample();
    r.tested_categories[1] = "=cmd|' /C calc'!A0";
    WriteupOptions o;
    o.style = WriteupStyle::tsv;
    const std::string s = writeup(a, r, o);
    CHECK(s.rfind("Test\tchi-square goodness-of-fit test\nStatistic\tχ²\nValue\t20.00\ndf\t3\nN\t100\np\t0.0001697\n"
                  "p-value method\tasymptotic\nLower-tail p (fit too good?)\t0.9998\nw (corrected for chance)\t0.41\n"
                  "Cohen's w before the correction, √(χ²/N)\t0.45\nw, 95% CI lower\t0.22\nw, 95% CI upper\t0.62\n"
                  "Conclusion\tnot consistent with the stated mix\nSentence\tA chi-square", 0) == 0);
    CHECK(s.find("\n\nCategory\tObserved\tExpected\tContribution\tAdjusted residual\tAdjusted p\tDirection\n") != std::string::npos);
    CHECK(s.find("\n'=cmd|' /C calc'!A0\t20\t25.00\t1.00\t-1.73\t0.5\tfewer than expected\n") != std::string::npos);
    o.decimal_comma = true;
    const std::string c = writeup(a, r, o);
    CHECK(c.find("\np\t0,0001697\n") != std::string::npos);
    CHECK(c.find("\t-1,73\t0,5\t") != std::string::npos);
}

TEST_CASE("a refused analysis") {
    Analysis a;
    Result r;
    r.status = Status::failure("There are no categories: paste lines of label and count.");
    CHECK(writeup(a, r, {}) == "Not analysed: There are no categories: paste lines of label and count.\n");
    WriteupOptions o;
    o.style = WriteupStyle::tsv;
    CHECK(writeup(a, r, o) == "Not analysed\tThere are no categories: paste lines of label and count.\n");
}

TEST_CASE("end to end through analyse()") {
    Analysis a;  // R 4.2: chisq.test(c(120, 90, 110, 80), p = rep(1/4, 4)): X-squared = 10, df = 3, p = 0.01856613546;
    a.categories = {"A", "B", "C", "D"};  // w = sqrt(10/400) = 0.158 (closed form); 95% CI by uniroot on
    a.observed = {120, 90, 110, 80};      // pchisq(10, 3, ncp): [0.02321204284, 0.24330945678]
    const Result r = analyse(a);
    REQUIRE(r.status.ok);
    CHECK(writeup_sentence(a, r, {}) ==
          "A chi-square goodness-of-fit test found that the counts were not consistent with the stated mix, "
          "χ²(3, N = 400) = 10.00, p = .019, w = 0.13, 95% CI [0.02, 0.24] (asymptotic).");  // sqrt((10 - 3) / 400)
}
