// A pasted third column read as a previous sample's counts (issue 14): detection from the
// header's words, the ParseOptions::third_column override, refusal of counts that are not whole,
// and that a third column without such a header is read as expected values as before. The
// pastes are written by the test; the header rule is ours (previous_sample_header.cpp), so the
// expected readings are read off the paste by hand. The 2 x k statistic of the pasted table is
// checked against SciPy's chi2_contingency in tests/cli/test_paste_previous_sample.py; here the
// pasted analysis must equal the same analysis stated with --values (two paths, one answer).
#include <doctest/doctest.h>

#include <string>

#include "analysis.hpp"
#include "paste_parser.hpp"
#include "pasted_analysis.hpp"
#include "pvalue_job.hpp"  // analyse_completely
#include "previous_sample_header.hpp"

using namespace tallyproof;
using S = std::vector<std::string>;
using D = std::vector<double>;

namespace {
bool has(const std::vector<std::string>& lines, const std::string& text) {
    for (const auto& n : lines)
        if (n == text) return true;
    return false;
}
ParsedInput third_as(const char* text, ThirdColumn choice) {
    ParseOptions o;
    o.third_column = choice;
    return parse_input(text, o);
}
const char* kMonths = "Category,This month,Last month\nA,150,140\nB,420,390\nC,190,230\nD,40,40\n";
}  // namespace

TEST_CASE("a third column headed as an earlier sample is read as its counts") {
    const ParsedInput p = parse_input(kMonths);
    REQUIRE(p.status.ok);
    CHECK(p.shape == InputShape::label_observed_expected);
    CHECK(p.column_names == S{"Category", "This month", "Last month"});
    CHECK(p.observed == D{150, 420, 190, 40});
    CHECK(p.expected == D{140, 390, 230, 40});
    CHECK(p.expected_kind == ExpectedKind::previous_sample);
    CHECK(has(p.notes, "Read 4 categories as label, observed and a previous sample's count (comma-separated, decimal point)."));
    CHECK(has(p.notes, "The third column, headed \"Last month\", is read as a previous sample's counts (its header names "
                       "an earlier sample): the two samples are compared by a test of homogeneity, N = 800 in the "
                       "previous sample."));
    CHECK(has(p.alternatives, "If the third column holds expected counts, shares or ratios rather than a previous sample, "
                              "read the third column as expected values."));

    Analysis pasted;
    REQUIRE(apply_pasted_input(p, &pasted));
    CHECK(pasted.model.kind == ModelKind::reference_sample);
    CHECK(pasted.model.values == D{140, 390, 230, 40});
    Analysis stated;  // the same test stated as --model reference-sample --values 140,390,230,40
    stated.categories = {"A", "B", "C", "D"};
    stated.observed = {150, 420, 190, 40};
    stated.model.kind = ModelKind::reference_sample;
    stated.model.values = {140, 390, 230, 40};
    const Result a = analyse_completely(pasted), b = analyse_completely(stated);
    REQUIRE(a.status.ok);
    CHECK(a.df == 3);
    CHECK(a.statistic == b.statistic);
    CHECK(a.upper.p == b.upper.p);
}

TEST_CASE("which headers name a previous sample") {
    for (const char* head : {"Last month", "LAST MONTH", "previous", "Prior year", "Before", "Baseline", "Control",
                             "earlier survey", "Wave 1", "Reference sample", "pre-test", "2023 (last year)"})
        CHECK_MESSAGE(names_previous_sample(head, "Count"), head);
    // Two headers both naming a period or a sample are two samples.
    CHECK(names_previous_sample("2023 survey", "2024 survey"));
    CHECK(names_previous_sample("Week 12", "Week 13"));
    CHECK_FALSE(names_previous_sample("Week 12", "Observed"));
    for (const char* head : {"Expected", "Expected last month", "Share", "Last month %", "Prior share", "Reference",
                             "Blast", "Lastly", "Model", "Weight", "Theoretical (before)", "", "Ratio"})
        CHECK_FALSE_MESSAGE(names_previous_sample(head, "Count"), head);
    CHECK_FALSE(names_previous_sample("2023 survey", "2024 expected"));
}

TEST_CASE("third column without such a header: expected values as before") {
    ParsedInput p = parse_input("A,150,140\nB,420,390\nC,190,230\nD,40,40\n");
    REQUIRE(p.status.ok);
    CHECK(p.expected_kind == ExpectedKind::counts);
    CHECK(has(p.notes, "The expected column was read as counts (they add up to the observed total 800)."));

    p = parse_input("Category,Observed,Expected\nA,150,140\nB,420,390\nC,190,230\nD,40,40\n");
    REQUIRE(p.status.ok);
    CHECK(p.expected_kind == ExpectedKind::counts);

    p = parse_input("Phenotype\tObserved\tExpected\nround yellow\t315\t9\nround green\t108\t3\n"
                    "wrinkled yellow\t101\t3\nwrinkled green\t32\t1\n");
    REQUIRE(p.status.ok);
    CHECK(p.expected_kind == ExpectedKind::ratios);
    Analysis a;
    REQUIRE(apply_pasted_input(p, &a));
    CHECK(a.model.kind == ModelKind::ratio);
}

TEST_CASE("the third-column choice overrides the header") {
    ParsedInput p = third_as(kMonths, ThirdColumn::expected);
    REQUIRE(p.status.ok);
    CHECK(p.expected_kind == ExpectedKind::counts);
    CHECK(p.alternatives.empty());
    Analysis a;
    REQUIRE(apply_pasted_input(p, &a));
    CHECK(a.model.kind == ModelKind::counts);

    p = third_as("A\t150\t140\nB\t420\t390\nC\t190\t230\nD\t40\t40\n", ThirdColumn::previous_sample);
    REQUIRE(p.status.ok);
    CHECK(p.expected_kind == ExpectedKind::previous_sample);
    CHECK(p.expected == D{140, 390, 230, 40});
    CHECK(has(p.notes, "The third column is read as a previous sample's counts (as chosen): the two samples are "
                       "compared by a test of homogeneity, N = 800 in the previous sample."));
    CHECK(p.alternatives.empty());

    p = third_as("Category,Observed,Expected\nA,150,140\nB,420,390\nC,190,230\nD,40,40\n", ThirdColumn::previous_sample);
    REQUIRE(p.status.ok);
    CHECK(p.expected_kind == ExpectedKind::previous_sample);
    CHECK(has(p.notes, "The third column, headed \"Expected\", is read as a previous sample's counts (as chosen): the two "
                       "samples are compared by a test of homogeneity, N = 800 in the previous sample."));

    // Automatic is the default; a two-column paste has no third column to choose for.
    CHECK(ParseOptions{}.third_column == ThirdColumn::automatic);
    p = third_as("A\t150\nB\t420\n", ThirdColumn::previous_sample);
    REQUIRE(p.status.ok);
    CHECK(p.expected.empty());
    CHECK(p.expected_kind == ExpectedKind::none);
}

TEST_CASE("a previous sample's counts must be whole: refused naming line and column") {
    ParsedInput p = parse_input("Category,This month,Last month\nA,150,140\nB,420,390.5\nC,190,230\n");
    CHECK_FALSE(p.status.ok);
    CHECK(p.status.line == 3);
    CHECK(p.status.column == 3);
    CHECK(p.status.message == "Line 3, column 3: \"390.5\" is not a whole number; the third column, headed \"Last month\", "
                              "is read as a previous sample's counts, which must be non-negative whole numbers. If it "
                              "holds expected values, read the third column as expected values instead.");
    p = parse_input("Group,After,Before\nA,15,14%\nB,42,39%\nC,19,47%\n");
    CHECK(p.status.message == "Line 2, column 3: \"14%\" is a percentage; the third column, headed \"Before\", is read "
                              "as a previous sample's counts, which must be non-negative whole numbers. If it holds "
                              "expected values, read the third column as expected values instead.");
    p = third_as("A\t15\t-2\nB\t42\t39\nC\t19\t47\n", ThirdColumn::previous_sample);
    CHECK(p.status.message == "Line 1, column 3: \"-2\" is negative; the third column is read as a previous sample's "
                              "counts, which must be non-negative whole numbers. If it holds expected values, read the "
                              "third column as expected values instead.");
    p = third_as("A\t15\t0\nB\t42\t0\nC\t19\t0\n", ThirdColumn::previous_sample);
    CHECK(p.status.message == "Line 1, column 3: the previous sample's counts are all zero; a previous sample needs at "
                              "least one count.");
    // The same decimals read as expected values are accepted.
    p = third_as("Category,This month,Last month\nA,150,140\nB,420,390.5\nC,190,230\n", ThirdColumn::expected);
    CHECK(p.status.ok);
}

TEST_CASE("third-column choice names") {
    for (ThirdColumn c : {ThirdColumn::automatic, ThirdColumn::expected, ThirdColumn::previous_sample}) {
        ThirdColumn back = ThirdColumn::automatic;
        CHECK(third_column_from_name(third_column_name(c), &back));
        CHECK(back == c);
    }
    CHECK(std::string(third_column_name(ThirdColumn::previous_sample)) == "previous");
    ThirdColumn unused;
    CHECK_FALSE(third_column_from_name("previous-sample", &unused));
    CHECK(std::string(expected_kind_name(ExpectedKind::previous_sample)) == "previous-sample");
}
