// Cell references in A1 notation. Values: the column letters every spreadsheet shows (common
// practice): A = 1, Z = 26, AA = 27, AZ = 52, BA = 53, ZZ = 702, AAA = 703, XFD = 16384, the last
// column of an Office Open XML sheet (ECMA-376 Part 1, 18.3.1.73 limits).
#include <doctest/doctest.h>

#include "cell_reference.hpp"

using namespace tallyproof;

TEST_CASE("column letters and numbers, both ways") {
    const std::pair<std::size_t, const char*> known[] = {{1, "A"}, {26, "Z"}, {27, "AA"}, {52, "AZ"}, {53, "BA"},
                                                         {702, "ZZ"}, {703, "AAA"}, {16384, "XFD"}};
    for (const auto& [n, s] : known) {
        CHECK(column_letters(n) == s);
        CHECK(column_number(s) == n);
    }
    for (std::size_t n = 1; n <= workbook_max_columns; ++n) REQUIRE(column_number(column_letters(n)) == n);
    CHECK(column_number("xfd") == 16384);
    CHECK(column_number("XFE") == 0);  // beyond the last column
    CHECK(column_number("A1") == 0);
    CHECK(column_number("") == 0);
    CHECK(column_letters(0).empty());
}

TEST_CASE("a cell name") {
    std::size_t r = 0, c = 0;
    CHECK(parse_cell_name("B7", &r, &c));
    CHECK(r == 7);
    CHECK(c == 2);
    CHECK(parse_cell_name("$AA$1048576", &r, &c));
    CHECK(r == 1048576);
    CHECK(c == 27);
    CHECK_FALSE(parse_cell_name("B0", &r, &c));
    CHECK_FALSE(parse_cell_name("A1048577", &r, &c));
    CHECK_FALSE(parse_cell_name("7B", &r, &c));
    CHECK_FALSE(parse_cell_name("B", &r, &c));
    CHECK(cell_name(7, 2) == "B7");
}

TEST_CASE("ranges: cells, whole columns, whole rows, one cell, reversed") {
    CellRange g;
    REQUIRE(parse_cell_range("A1:D20", &g).ok);
    CHECK(g.first_row == 1);
    CHECK(g.last_row == 20);
    CHECK(g.first_column == 1);
    CHECK(g.last_column == 4);
    CHECK(g.contains(20, 4));
    CHECK_FALSE(g.contains(21, 4));
    REQUIRE(parse_cell_range(" d20:a1 ", &g).ok);
    CHECK(g.first_row == 1);
    CHECK(g.last_column == 4);
    REQUIRE(parse_cell_range("B:D", &g).ok);
    CHECK(g.first_row == 0);
    CHECK(g.first_column == 2);
    CHECK(g.contains(500000, 3));
    CHECK_FALSE(g.contains(1, 1));
    REQUIRE(parse_cell_range("3:9", &g).ok);
    CHECK(g.first_column == 0);
    CHECK(g.contains(3, 9000));
    REQUIRE(parse_cell_range("C4", &g).ok);
    CHECK(g.first_row == 4);
    CHECK(g.last_column == 3);
    const Status bad = parse_cell_range("A1:D", &g);
    CHECK_FALSE(bad.ok);
    CHECK(bad.message.find("A1:D20") != std::string::npos);
    CHECK_FALSE(parse_cell_range("Sheet1!A1:B2", &g).ok);
    CHECK_FALSE(parse_cell_range("", &g).ok);
}
