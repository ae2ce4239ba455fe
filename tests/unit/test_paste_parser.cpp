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

TEST_CASE("the one-cell fast path of the reader gives what next() gives") {
    // Reference: DelimitedReader::next alone (RFC 4180 reading, delimited_text.hpp). Mixing
    // next_single_cell in must give the same cells on the same lines, for every separator.
    const std::vector<std::string> texts = {
        "12.50\n7\n\n1234567.25\r\n0.0347\r3\n",           // LF, CRLF, CR, a blank line
        "a\nlonger-than-eight-bytes\nb c\n\"q\"\n9",        // spaces, a quote, no final line end
        "x\t1\n2\n3,5\n4;6\n\"a\nb\"\n7\n",                 // separators, a quoted line break
        "\xC2\xA0" "12\n12\xC2\xA0\n\xE2\x82\xAC" "5\n8\n",  // no-break spaces and UTF-8 around cells
        " 5\n6 \n\t7\n8\x01\n~!\n",                          // blanks and control bytes at the ends
        "\"open\n1\n2\n",                                    // a quote never closed
        std::string(1000, '1') + "\n" + std::string(17, '2'), ""};
    for (Separator sep : {Separator::tab, Separator::comma, Separator::semicolon, Separator::spaces})
        for (const auto& text : texts) {
            CAPTURE(text);
            CAPTURE(separator_name(sep));
            std::vector<std::pair<int, std::string>> slow, fast;
            DelimitedReader a(text, sep), b(text, sep);
            Record rec;
            while (a.next(&rec))
                for (auto c : rec.cells) slow.emplace_back(rec.line, std::string(c));
            for (;;) {
                std::string_view cell;
                int line = 0;
                if (b.next_single_cell(&cell, &line)) { fast.emplace_back(line, std::string(cell)); continue; }
                if (!b.next(&rec)) break;
                for (auto c : rec.cells) fast.emplace_back(rec.line, std::string(c));
            }
            CHECK(fast == slow);
            CHECK(a.status().ok == b.status().ok);
            CHECK(a.status().message == b.status().message);
        }
}
