// Paste parser: spreadsheet-style text in, counts or a refusal naming line and column out.
// Expected values are common practice for tab-separated clipboard text (no external source
// needed): every paste is written here by hand, and every expected count is read off it.
#include <doctest/doctest.h>

#include "paste_parser.hpp"

using namespace tallyproof;

TEST_CASE("label and count lines, as a spreadsheet copies them") {
    const ParsedCounts p = parse_counts("Grade A\t48\r\nGrade B\t35\r\nGrade C\t17\r\n");
    REQUIRE(p.status.ok);
    CHECK(p.categories == std::vector<std::string>{"Grade A", "Grade B", "Grade C"});  // common practice
    CHECK(p.observed == std::vector<double>{48, 35, 17});
}

TEST_CASE("header row, blank lines, trailing empty cells and a byte-order mark") {
    const ParsedCounts p = parse_counts("\xEF\xBB\xBFGrade\tCount\n\nA\t4\t\t\nB\t6\n\n");
    REQUIRE(p.status.ok);
    CHECK(p.categories == std::vector<std::string>{"A", "B"});  // header and BOM not categories
    CHECK(p.observed[1] == 6);
    bool header_noted = false;
    for (const auto& n : p.notes) header_noted = header_noted || n == "Line 1 read as a header row.";
    CHECK(header_noted);
}

TEST_CASE("a single column of counts gets numbered labels") {
    const ParsedCounts p = parse_counts("12\n15\n9\n");
    REQUIRE(p.status.ok);
    CHECK(p.categories == std::vector<std::string>{"Category 1", "Category 2", "Category 3"});
    CHECK(p.observed == std::vector<double>{12, 15, 9});
}

TEST_CASE("space-separated text without tabs") {
    const ParsedCounts p = parse_counts("small fruit  14\nlarge fruit 22\n");
    REQUIRE(p.status.ok);
    CHECK(p.categories[0] == "small fruit");  // runs of spaces inside a label become one space
    CHECK(p.observed[1] == 22);
}

TEST_CASE("bad input names line and column") {
    ParsedCounts p = parse_counts("");
    CHECK_FALSE(p.status.ok);
    CHECK(p.status.message == "Nothing to read: the pasted text is empty.");

    p = parse_counts("A\t4\nB\t-2\n");
    CHECK_FALSE(p.status.ok);
    CHECK(p.status.line == 2);
    CHECK(p.status.column == 2);
    CHECK(p.status.message == "Line 2, column 2: \"-2\" is negative; counts must be non-negative whole numbers.");

    p = parse_counts("A\t4\nB\tmany\n");
    CHECK(p.status.message == "Line 2, column 2: \"many\" is not a count; expected a non-negative whole number.");

    p = parse_counts("A\t4\nB\t2.5\n");
    CHECK(p.status.line == 2);
    CHECK(p.status.message == "Line 2, column 2: \"2.5\" is not a whole number; counts must be whole numbers.");

    p = parse_counts("A\t4\nA\t5\n");
    CHECK(p.status.line == 2);
    CHECK(p.status.message ==
          "Line 2, column 1: the label \"A\" appears twice (first on line 1); each category needs its own label.");

    // Too many cells: three are now label, observed and expected, so four are too many.
    p = parse_counts("A\t1\t2\t3\nB\t4\t5\n");
    CHECK_FALSE(p.status.ok);
    CHECK(p.status.line == 1);
    CHECK(p.status.column == 4);
    CHECK(p.status.message == "Line 1, column 4: found 4 cells; expected a label, a count and an expected value.");
}

TEST_CASE("12.0 is a whole number") {
    const ParsedCounts p = parse_counts("A\t12.0\nB\t3\n");
    REQUIRE(p.status.ok);
    CHECK(p.observed[0] == 12);
}
