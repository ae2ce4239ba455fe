// Paste shapes, separators and number formats, and the exact message for every refusal.
// Each paste is a realistic clipboard or CSV text written by the test itself; the expected
// categories and counts are read off the paste by hand. Shapes and formats are common practice
// for spreadsheet text (RFC 4180 for quoting); no external source needed.
#include <doctest/doctest.h>

#include <chrono>
#include <cmath>
#include <string>

#include "paste_parser.hpp"

using namespace tallyproof;
using S = std::vector<std::string>;
using D = std::vector<double>;

namespace {
bool has_note(const ParsedInput& p, const std::string& text) {
    for (const auto& n : p.notes)
        if (n == text) return true;
    return false;
}
ParsedInput with(const char* text, ParseOptions o) { return parse_input(text, o); }
}  // namespace

TEST_CASE("label and count in every separator") {
    for (const char* text : {"red\t12\nblue\t30\n", "red,12\nblue,30\n", "red;12\nblue;30\n", "red   12\nblue 30\n"}) {
        const ParsedInput p = parse_input(text);
        REQUIRE_MESSAGE(p.status.ok, text);
        CHECK(p.shape == InputShape::label_count);
        CHECK(p.categories == S{"red", "blue"});
        CHECK(p.observed == D{12, 30});
    }
    CHECK(parse_input("red\t12\nblue\t30\n").separator == Separator::tab);
    CHECK(parse_input("red,12\nblue,30\n").separator == Separator::comma);
    CHECK(parse_input("red;12\nblue;30\n").separator == Separator::semicolon);
    CHECK(parse_input("red 12\nblue 30\n").separator == Separator::spaces);
    const ParsedInput p = parse_input("red\t12\nblue\t30\n");
    CHECK(p.notes.front() == "Read 2 categories as label and count (tab-separated, decimal point).");
}

TEST_CASE("header row kept as column names; blank lines and trailing empty cells ignored") {
    const ParsedInput p = parse_input("Colour\tCount\t\t\n\nred\t12\t\t\n\n\nblue\t30\n\t\t\n");
    REQUIRE(p.status.ok);
    CHECK(p.column_names == S{"Colour", "Count"});
    CHECK(p.categories == S{"red", "blue"});
    CHECK(has_note(p, "Line 1 read as a header row."));
}

TEST_CASE("line ends: CRLF, CR and LF, and a byte-order mark") {
    for (const char* text : {"\xEF\xBB\xBFred\t12\r\nblue\t30\r\n", "red\t12\rblue\t30\r", "red\t12\nblue\t30"}) {
        const ParsedInput p = parse_input(text);
        REQUIRE(p.status.ok);
        CHECK(p.categories == S{"red", "blue"});
        CHECK(p.observed == D{12, 30});
    }
}

TEST_CASE("RFC 4180 quoting: separators, doubled quotes and line breaks inside fields") {
    const ParsedInput p = parse_input("\"Smith, J.\",3\r\n\"say \"\"hi\"\"\",4\r\n\"two\r\nlines\",5\r\nlast,6\r\n");
    REQUIRE(p.status.ok);
    CHECK(p.categories == S{"Smith, J.", "say \"hi\"", "two\r\nlines", "last"});
    CHECK(p.observed == D{3, 4, 5, 6});
    const ParsedInput q = parse_input("a,1\n\"b,2\nc,3\n");
    CHECK(q.status.message == "Line 2, column 1: the quote opened here is never closed; expected a closing \".");
    CHECK(q.status.line == 2);
    // Line numbers after a quoted line break count physical lines.
    const ParsedInput r = parse_input("\"x\ny\",1\nz,-1\n");
    CHECK(r.status.message == "Line 3, column 2: \"-1\" is negative; counts must be non-negative whole numbers.");
}

TEST_CASE("label, observed and expected: shares, percentages, ratios, counts") {
    ParsedInput p = parse_input("a\t10\t0.25\nb\t20\t0.25\nc\t30\t0.5\n");
    REQUIRE(p.status.ok);
    CHECK(p.shape == InputShape::label_observed_expected);
    CHECK(p.expected == D{0.25, 0.25, 0.5});
    CHECK(p.expected_kind == ExpectedKind::shares);
    CHECK(has_note(p, "The expected column was read as shares (they add up to 1)."));

    p = parse_input("a\t10\t25%\nb\t20\t25%\nc\t30\t50%\n");
    CHECK(p.expected_kind == ExpectedKind::percentages);
    CHECK(p.expected == D{25, 25, 50});
    CHECK(has_note(p, "The expected column was read as percentages (written with % signs)."));

    p = parse_input("a\t10\t25\nb\t20\t25\nc\t30\t50\n");
    CHECK(p.expected_kind == ExpectedKind::percentages);
    CHECK(has_note(p, "The expected column was read as percentages (they add up to 100)."));

    // Mendel's 9:3:3:1 (Mendel 1866 counts 315, 108, 101, 32).
    p = parse_input("Phenotype\tObserved\tExpected\nround yellow\t315\t9\nround green\t108\t3\nwrinkled yellow\t101\t3\nwrinkled green\t32\t1\n");
    REQUIRE(p.status.ok);
    CHECK(p.column_names == S{"Phenotype", "Observed", "Expected"});
    CHECK(p.expected_kind == ExpectedKind::ratios);
    CHECK(has_note(p, "The expected column was read as ratios (they add up to 16, neither 1, 100 nor the observed total)."));

    p = parse_input("a\t10\t15\nb\t20\t15\nc\t30\t30\n");
    CHECK(p.expected_kind == ExpectedKind::counts);
    CHECK(has_note(p, "The expected column was read as counts (they add up to the observed total 60)."));
}

TEST_CASE("single column and single row of counts") {
    ParsedInput p = parse_input("Count\n12\n15\n9\n");
    REQUIRE(p.status.ok);
    CHECK(p.shape == InputShape::counts_column);
    CHECK(p.column_names == S{"Count"});
    CHECK(p.categories == S{"Category 1", "Category 2", "Category 3"});

    p = parse_input("12\t15\t9\t20\n");
    REQUIRE(p.status.ok);
    CHECK(p.shape == InputShape::counts_row);
    CHECK(p.observed == D{12, 15, 9, 20});
    CHECK(p.categories == S{"Category 1", "Category 2", "Category 3", "Category 4"});

    p = parse_input("Mon\tTue\tWed\n58\t44\t47\n");
    REQUIRE(p.status.ok);
    CHECK(p.shape == InputShape::counts_row);
    CHECK(p.categories == S{"Mon", "Tue", "Wed"});
    CHECK(p.observed == D{58, 44, 47});

    p = parse_input("Day\tMon\tTue\tWed\nTickets\t58\t44\t47\n");  // with a corner cell and a row heading
    REQUIRE(p.status.ok);
    CHECK(p.categories == S{"Mon", "Tue", "Wed"});
    CHECK(p.observed == D{58, 44, 47});
}

TEST_CASE("a trailing totals row equal to the sum is dropped, with a note") {
    ParsedInput p = parse_input("A\t10\nB\t20\nC\t30\nTotal\t60\n");
    REQUIRE(p.status.ok);
    CHECK(p.categories == S{"A", "B", "C"});
    CHECK(has_note(p, "Line 4 (60) equals the sum of the counts above it: dropped as a totals row."));
    p = parse_input("A;10\nB;20\nC;30\nSumme:;60\n");
    CHECK(p.categories == S{"A", "B", "C"});
    p = parse_input("A\t10\nB\t20\nC\t30\nTotal\t61\n");
    CHECK(p.status.message ==
          "Line 4, column 2: the totals row \"Total\" gives 61, but the counts above add up to 60; expected their sum, or no totals row.");
    p = parse_input("10\n20\n30\n5\n65\n");  // an unlabelled last value equal to the sum above
    CHECK(p.observed == D{10, 20, 30, 5});
    CHECK(p.alternatives.size() == 1);
}

TEST_CASE("raw text values tallied: trimmed, first-seen or sorted, case folding optional") {
    ParsedInput p = parse_input("red\nblue\n  red \nRed\ngreen\nblue\n");
    REQUIRE(p.status.ok);
    CHECK(p.shape == InputShape::raw_text);
    CHECK(p.categories == S{"red", "blue", "Red", "green"});
    CHECK(p.observed == D{2, 2, 1, 1});
    ParseOptions o;
    o.case_fold = true;
    o.sorted = true;
    p = with("red\nblue\n  red \nRed\ngreen\nblue\n", o);
    CHECK(p.categories == S{"blue", "green", "red"});
    CHECK(p.observed == D{2, 1, 3});
    p = parse_input("New York\nBoston\nNew  York\n");  // spaces inside a value
    CHECK(p.categories == S{"New York", "Boston"});
    CHECK(p.observed == D{2, 1});
    p = parse_input("yes\tno\tyes\tyes\n");  // one row of values across cells
    CHECK(p.categories == S{"yes", "no"});
    CHECK(p.observed == D{3, 1});
}

TEST_CASE("raw whole numbers become ordered categories with zero-filled gaps") {
    std::string defects = "Defects\n";
    const int values[] = {0, 1, 0, 2, 0, 1, 0, 0, 4, 1, 0, 0, 1, 2, 0, 0, 0, 1, 0, 4, 0, 6};
    for (int v : values) defects += std::to_string(v) + "\n";
    const ParsedInput p = parse_input(defects);
    REQUIRE(p.status.ok);
    CHECK(p.shape == InputShape::raw_whole_numbers);
    CHECK(p.ordered);
    CHECK(p.column_names == S{"Defects"});
    CHECK(p.categories == S{"0", "1", "2", "3", "4", "5", "6"});
    CHECK(p.observed == D{12, 5, 2, 0, 2, 0, 1});  // counted by hand from `values`
    ParseOptions raw;
    raw.raw = true;
    // Plain digits and other written forms of the same whole numbers are one category each,
    // on both sides of 0 and of 1023 (the small values are counted apart from the others).
    const ParsedInput m = with("1022\n1,023\n1023\n1024\n1022.0\n1025\n0001023\n", raw);
    REQUIRE(m.status.ok);
    CHECK(m.categories == S{"1022", "1023", "1024", "1025"});
    CHECK(m.observed == D{2, 3, 1, 1});  // "1022", "1022.0"; "1,023", "1023", "0001023"; "1024"; "1025"
    const ParsedInput z = with("-0\n0\n\xE2\x88\x92" "1\n-1\n1\n-2\n", raw);
    REQUIRE(z.status.ok);
    CHECK(z.categories == S{"-2", "-1", "0", "1"});
    CHECK(z.observed == D{1, 2, 2, 1});  // "-2"; "\u22121", "-1"; "-0", "0"; "1"
    const ParsedInput q = with("3\n5\n3\n", raw);  // forced: too few to tell from counts
    CHECK(q.categories == S{"3", "4", "5"});
    CHECK(q.observed == D{2, 0, 1});
    const ParsedInput r = with("0\n5000\n", raw);
    CHECK(r.status.message ==
          "The whole numbers run from 0 to 5000, which would make 5001 categories; expected at most 1000: count them into bins instead.");
}

TEST_CASE("raw numbers for digit tests, in every written form") {
    ParseOptions o;
    o.digits = DigitTest::first;
    const ParsedInput p = with("Amount\n$1,234.50\n\xE2\x82\xAC 250\n(312.00)\n\xE2\x88\x92" "45\n0\n9e3\nn/a\n"
                               "1\xC2\xA0" "234\n7'500.25\n\xC2\xA3" "6.10\n", o);
    REQUIRE(p.status.ok);
    CHECK(p.shape == InputShape::raw_digits);
    CHECK(p.categories == S{"1", "2", "3", "4", "5", "6", "7", "8", "9"});
    CHECK(p.observed == D{2, 1, 1, 1, 0, 1, 1, 0, 1});  // 1234.50, 250, 312, 45, 9e3, 1234, 7500.25, 6.10
    CHECK(has_note(p, "1 value left out: not a number (first at line 8, column 1)."));
    CHECK(has_note(p, "1 value left out: zero (first at line 6, column 1)."));
    o.digits = DigitTest::last;
    const ParsedInput q = with("12,50\n3,07\n1.234,5\n", [&] { ParseOptions c = o; c.decimal = DecimalMark::comma; return c; }());
    REQUIRE(q.status.ok);
    CHECK(q.observed == D{1, 0, 0, 0, 0, 1, 0, 1, 0, 0});  // last digits as written: 0, 7, 5
}

TEST_CASE("raw numbers into bins: given edges, equal widths and equal probabilities") {
    ParseOptions o;
    o.bins.kind = BinChoice::Kind::edges;
    o.bins.edges = {0, 10, 20, HUGE_VAL};
    ParsedInput p = with("3.5\n10\n19.99\n25\n0\n", o);
    REQUIRE(p.status.ok);
    CHECK(p.categories == S{"[0, 10)", "[10, 20)", "[20, inf)"});
    CHECK(p.observed == D{2, 2, 1});
    CHECK(p.edges == D{0, 10, 20, HUGE_VAL});
    p = with("3.5\n-1\n", o);
    CHECK(p.status.message ==
          "Line 2, column 1: \"-1\" is outside the bins (0 to inf); expected a value inside, or open end edges -inf and inf.");
    o.bins.kind = BinChoice::Kind::equal_width;
    o.bins.bins = 4;
    p = with("0\n1\n2\n3\n4\n8\n", o);  // width 2: [0,2) [2,4) [4,6) [6,8]
    REQUIRE(p.status.ok);
    CHECK(p.observed == D{2, 2, 1, 1});
    CHECK(p.categories.back() == "[6, 8]");
    o.bins.kind = BinChoice::Kind::equal_probability;  // more in test_equal_probability_bins.cpp
    p = with("1\n2\n", o);
    REQUIRE(p.status.ok);
    CHECK(p.observed == D{1, 0, 0, 1});  // quartiles of Normal(1.5, 0.5): 1.1628, 1.5, 1.8372 (SciPy norm.ppf)
}

TEST_CASE("number formats in count columns, and ambiguous 1,234 decided from the whole column") {
    ParsedInput p = parse_input("A\t1 234\nB\t2\xC2\xA0" "500\nC\t1'000\nD\t3\xE2\x80\xAF" "000\n");
    REQUIRE(p.status.ok);
    CHECK(p.observed == D{1234, 2500, 1000, 3000});
    p = parse_input("Colour,Count\nred,\"1,234\"\nblue,\"2,500\"\n");
    REQUIRE(p.status.ok);
    CHECK(p.observed == D{1234, 2500});
    CHECK(has_note(p, "\"1,234\" (line 2, column 2) could be read two ways; read as 1234 with a decimal point, as counts are whole numbers (2 such cells)."));
    CHECK(p.alternatives == S{"With a decimal comma, \"1,234\" would be 1.234."});
    p = parse_input("Farbe;Anzahl\nrot;1.234\nblau;2.500\n");
    CHECK(p.decimal == DecimalMark::comma);
    CHECK(p.observed == D{1234, 2500});
    p = parse_input("a\t1.234\nb\t12.5\n");  // one cell settles it: decimal point, so 1.234 is not whole
    CHECK(p.status.message == "Line 1, column 2: \"1.234\" is not a whole number; counts must be whole numbers.");
    ParseOptions o;
    o.decimal = DecimalMark::comma;
    p = with("a\t1.234\nb\t12\n", o);
    CHECK(p.observed == D{1234, 12});
    p = parse_input("a;12,0\nb;3\n");
    CHECK(p.observed == D{12, 3});
}

TEST_CASE("bad input: each refusal names line and column, quotes the cell, says what was expected") {
    struct Case { const char* text; const char* message; int line, column; };
    const Case cases[] = {
        {"", "Nothing to read: the pasted text is empty.", 0, 0},
        {" \r\n\t\n", "Nothing to read: the pasted text is empty.", 0, 0},
        {";;\n;;\n", "No counts found: paste lines of label and count.", 0, 0},
        {"Only\t7\n", "Only one category (\"Only\"): a goodness-of-fit test needs at least two.", 1, 2},
        {"A\t4\nB\t-2\n", "Line 2, column 2: \"-2\" is negative; counts must be non-negative whole numbers.", 2, 2},
        {"A\t4\nB\t(3)\n", "Line 2, column 2: \"(3)\" is negative; counts must be non-negative whole numbers.", 2, 2},
        {"A\t4\nB\t12.5\n", "Line 2, column 2: \"12.5\" is not a whole number; counts must be whole numbers.", 2, 2},
        {"A\t4\nB\t40%\n", "Line 2, column 2: \"40%\" is a percentage; counts must be non-negative whole numbers. Enter how many items fell in each category: a test on percentages is wrong by a factor of N/100.", 2, 2},
        {"A\t4\nB\tlots\n", "Line 2, column 2: \"lots\" is not a count; expected a non-negative whole number.", 2, 2},
        {"A\t4\nB\t1e300\n", "Line 2, column 2: \"1e300\" is too large; expected a count below 2^53.", 2, 2},
        {"A\t9007199254740992\nB\t5\n",  // 2^53 itself: not every neighbour is representable
         "Line 1, column 2: \"9007199254740992\" is too large; expected a count below 2^53.", 1, 2},
        {"A\t4\nB\t\xFF\n", "Line 2, column 2: \"\xEF\xBF\xBD\" is not a count; expected a non-negative whole number.", 2, 2},
        {"A\t4\nA\t5\n", "Line 2, column 1: the label \"A\" appears twice (first on line 1); each category needs its own label.", 2, 1},
        {"A\t4\nB\n", "Line 2, column 2: nothing after \"B\"; expected a label and a count on every line.", 2, 2},
        {"A\t4\t0.5\nB\t6\n", "Line 2, column 3: nothing after \"6\"; expected a label, a count and an expected value on every line.", 2, 3},
        {"A\t4\t0.5\nB\t6\tx\n", "Line 2, column 3: \"x\" is not an expected value; expected a share, percentage, ratio term or expected count.", 2, 3},
        {"A\t4\t0.5\nB\t6\t-0.5\n", "Line 2, column 3: \"-0.5\" is negative; expected values must be zero or more.", 2, 3},
        {"A\t4\t0\nB\t6\t0\n", "Line 1, column 3: the expected values are all zero; expected shares, percentages, ratio terms or counts.", 1, 3},
        {"A\t1\t2\t3\nB\t4\t5\n", "Line 1, column 4: found 4 cells; expected a label, a count and an expected value.", 1, 4},
        {"12\n15\n9.5\n", "Line 3, column 1: \"9.5\" is not a whole number; counts must be whole numbers.", 3, 1},
    };
    for (const Case& c : cases) {
        const ParsedInput p = parse_input(c.text);
        CHECK_MESSAGE(!p.status.ok, c.text);
        CHECK_MESSAGE(p.status.message == c.message, c.text);
        if (c.line) { CHECK_MESSAGE(p.status.line == c.line, c.text); CHECK_MESSAGE(p.status.column == c.column, c.text); }
    }
}

TEST_CASE("a forced shape that does not fit is refused at the cell that breaks it") {
    ParseOptions o;
    o.shape = InputShape::counts_row;
    ParsedInput p = with("a\tb\n1\t2\n3\t4\n", o);
    CHECK(p.status.message == "Line 3, column 1: a third row; expected one row of counts, optionally under a row of labels.");
    o.shape = InputShape::counts_column;
    p = with("1\t2\n3\t4\n", o);
    CHECK(p.status.message == "Line 1, column 2: found 2 cells; expected one count per line.");
    const ParsedInput q = parse_input("a\tb\n1\t2\n3\t4\n");  // unforced: a header over numeric labels
    CHECK(q.shape == InputShape::label_count);
    CHECK(q.categories == S{"1", "3"});
}

TEST_CASE("labels that are not valid UTF-8 are shown with replacement characters, with a note") {
    const ParsedInput p = parse_input("\xFF\xFE\t3\nB\t5\n");  // Latin-1 bytes pasted as they are
    REQUIRE(p.status.ok);
    CHECK(p.categories[0] == "\xEF\xBF\xBD\xEF\xBF\xBD");  // two U+FFFD (Unicode 15, section 3.9)
    CHECK(has_note(p, "Line 1, column 1: the label is not valid UTF-8 text; unreadable bytes are shown as \xEF\xBF\xBD."));
    CHECK(valid_utf8("gr\xC3\xBCn"));                  // ü
    CHECK_FALSE(valid_utf8("\xC0\x80"));               // overlong
    CHECK_FALSE(valid_utf8("\xED\xA0\x80"));          // a surrogate
}

TEST_CASE("every offending cell is listed for the page to mark") {
    const ParsedInput p = parse_input("A\t4\nB\t-2\nC\t2.5\nD\tmany\nA\t5\n");
    REQUIRE(p.problems.size() == 4);
    CHECK(p.problems[0].line == 2);
    CHECK(p.problems[1].line == 3);
    CHECK(p.problems[2].line == 4);
    CHECK(p.problems[3].line == 5);
    CHECK(p.problems[3].column == 1);
    CHECK(p.status.message == p.problems[0].message);
}

TEST_CASE("size guards: large pastes finish or refuse quickly, memory by categories") {
    std::string distinct;
    for (int i = 0; i < 150000; ++i) distinct += "v" + std::to_string(i) + "\n";
    ParsedInput p = parse_input(distinct);
    CHECK(p.status.message ==
          "Line 100001, column 1: \"v100000\" would be category 100001; expected at most 100000 different values.");
    std::string table;
    for (int i = 0; i < 150000; ++i) table += "c" + std::to_string(i) + "\t1\n";
    p = parse_input(table);
    CHECK(p.status.message == "Line 100002: more than 100000 rows; expected a table of at most that many categories.");
    std::string digits(4000000, '\n');  // two million one-digit lines
    for (std::size_t i = 0; i < digits.size(); i += 2) digits[i] = static_cast<char>('0' + (i / 2) % 10);
    const auto t0 = std::chrono::steady_clock::now();
    p = parse_input(digits);
    const double seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
    REQUIRE(p.status.ok);
    CHECK(p.shape == InputShape::raw_whole_numbers);
    CHECK(p.observed == D(10, 200000));
    CHECK(seconds < 20);  // generous: sanitizer builds are slow
}

TEST_CASE("parse_counts is parse_input with default options") {
    const char* text = "Grade\tCount\nA\t18\nB\t25\n";
    const ParsedCounts c = parse_counts(text);
    const ParsedInput p = parse_input(text);
    CHECK(c.categories == p.categories);
    CHECK(c.observed == p.observed);
    CHECK(c.notes == p.notes);
}

TEST_CASE("decimals in a count column: the percentages note only where they add up to about 100 or 1") {
    // Common practice: counts, not percentages, go into a chi-square test (the statistic scales with N).
    const ParsedInput pct = parse_input("A\t25.5\nB\t74.5\n");
    CHECK_FALSE(pct.status.ok);
    CHECK(pct.status.message.find("a test on percentages is wrong by a factor of N/100") != std::string::npos);
    const ParsedInput shares = parse_input("A\t0.25\nB\t0.75\n");
    CHECK(shares.status.message.find("percentages or shares") != std::string::npos);
    const ParsedInput weights = parse_input("517.1\n498.3\n502.9\n");  // measurements, not counts
    CHECK_FALSE(weights.status.ok);
    CHECK(weights.status.message.find("percentages") == std::string::npos);
}
