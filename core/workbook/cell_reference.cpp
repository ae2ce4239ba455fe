// Cell references in A1 notation (ECMA-376 Part 1, 18.3.1.4; common spreadsheet practice).
#include "cell_reference.hpp"

#include <algorithm>

namespace tallyproof {

std::string column_letters(std::size_t column) {
    std::string s;
    while (column > 0) {
        const std::size_t d = (column - 1) % 26;
        s.insert(s.begin(), static_cast<char>('A' + d));
        column = (column - 1) / 26;
    }
    return s;
}

std::size_t column_number(std::string_view letters) {
    if (letters.empty() || letters.size() > 3) return 0;
    std::size_t n = 0;
    for (char c : letters) {
        if (c >= 'a' && c <= 'z') c = static_cast<char>(c - 'a' + 'A');
        if (c < 'A' || c > 'Z') return 0;
        n = n * 26 + static_cast<std::size_t>(c - 'A' + 1);
    }
    return n <= workbook_max_columns ? n : 0;
}

std::string cell_name(std::size_t row, std::size_t column) { return column_letters(column) + std::to_string(row); }

std::string range_name(const CellRange& r) {
    const std::string first = cell_name(r.first_row, r.first_column);
    if (r.first_row == r.last_row && r.first_column == r.last_column) return first;
    return first + ":" + cell_name(r.last_row, r.last_column);
}

namespace {

// Reads an optional '$', then letters; returns how many characters were used (0 if none).
std::size_t take_letters(std::string_view t, std::size_t* column) {
    std::size_t i = t.size() > 0 && t[0] == '$' ? 1 : 0;
    std::size_t j = i;
    while (j < t.size() && ((t[j] >= 'A' && t[j] <= 'Z') || (t[j] >= 'a' && t[j] <= 'z'))) ++j;
    if (j == i) return 0;
    *column = column_number(t.substr(i, j - i));
    return *column ? j : 0;
}

std::size_t take_digits(std::string_view t, std::size_t* row) {
    std::size_t i = t.size() > 0 && t[0] == '$' ? 1 : 0;
    std::size_t j = i, n = 0;
    while (j < t.size() && t[j] >= '0' && t[j] <= '9') {
        if (n > workbook_max_rows) return 0;
        n = n * 10 + static_cast<std::size_t>(t[j] - '0');
        ++j;
    }
    if (j == i || n == 0 || n > workbook_max_rows) return 0;
    *row = n;
    return j;
}

// One end of a range: a cell, a column alone or a row alone.
bool parse_end(std::string_view t, std::size_t* row, std::size_t* column) {
    *row = *column = 0;
    const std::size_t a = take_letters(t, column);
    if (a == t.size() && a > 0) return true;  // column alone
    const std::size_t b = take_digits(t.substr(a), row);
    return b > 0 && a + b == t.size();
}

}  // namespace

bool parse_cell_name(std::string_view text, std::size_t* row, std::size_t* column) {
    std::size_t r = 0, c = 0;
    if (!parse_end(text, &r, &c) || r == 0 || c == 0) return false;
    *row = r;
    *column = c;
    return true;
}

Status parse_cell_range(std::string_view text, CellRange* range) {
    while (!text.empty() && (text.front() == ' ' || text.front() == '\t')) text.remove_prefix(1);
    while (!text.empty() && (text.back() == ' ' || text.back() == '\t')) text.remove_suffix(1);
    const auto refuse = [&]() {
        return Status::failure("\"" + std::string(text) + "\" is not a range of cells: write it as A1:D20 (first cell, colon, last cell), "
                               "B:D for whole columns, 3:9 for whole rows or C4 for one cell");
    };
    const std::size_t colon = text.find(':');
    std::size_t r1 = 0, c1 = 0, r2 = 0, c2 = 0;
    if (colon == std::string_view::npos) {
        if (!parse_cell_name(text, &r1, &c1)) return refuse();
        *range = CellRange{r1, r1, c1, c1};
        return Status::success();
    }
    if (!parse_end(text.substr(0, colon), &r1, &c1) || !parse_end(text.substr(colon + 1), &r2, &c2)) return refuse();
    // Both ends of one kind: cells, columns alone or rows alone.
    if ((r1 == 0) != (r2 == 0) || (c1 == 0) != (c2 == 0)) return refuse();
    CellRange r{std::min(r1, r2), std::max(r1, r2), std::min(c1, c2), std::max(c1, c2)};
    *range = r;
    return Status::success();
}

}  // namespace tallyproof
