// Cell references of a spreadsheet: column letters (A, Z, AA, XFD) to and from 1-based numbers,
// a cell "B7" and a range "A1:D20" (or "B:D", "3:9", one cell "C4"). The A1 notation is the one
// Office Open XML (ECMA-376 Part 1, 18.3.1.4 "c", attribute r) and spreadsheet users write.
#pragma once
#include <cstddef>
#include <string>
#include <string_view>

#include "status.hpp"

namespace tallyproof {

// A rectangle of cells, 1-based and inclusive; 0 for a side left open ("B:D" has no rows given).
struct CellRange {
    std::size_t first_row = 0, last_row = 0;
    std::size_t first_column = 0, last_column = 0;
    bool contains(std::size_t row, std::size_t column) const {
        return (first_row == 0 || row >= first_row) && (last_row == 0 || row <= last_row) &&
               (first_column == 0 || column >= first_column) && (last_column == 0 || column <= last_column);
    }
};

// The largest sheet the Office Open XML and OpenDocument formats allow: 1,048,576 rows and 16,384
// columns (XFD) in Office Open XML (ECMA-376 Part 1, 18.3.1.73); OpenDocument allows as many.
inline constexpr std::size_t workbook_max_rows = 1048576;
inline constexpr std::size_t workbook_max_columns = 16384;

std::string column_letters(std::size_t column);                  // 1 -> "A", 27 -> "AA"; "" for 0
std::size_t column_number(std::string_view letters);             // "AA" -> 27; 0 if not letters or beyond XFD
std::string cell_name(std::size_t row, std::size_t column);      // (7, 2) -> "B7"
std::string range_name(const CellRange& range);                  // "A1:C12"; "B4" for one cell (a closed range)
// "B7" -> row 7, column 2 (a "$" before either part is allowed, as in $B$7); false if not a cell.
bool parse_cell_name(std::string_view text, std::size_t* row, std::size_t* column);
// "A1:D20", "$A$1:$D$20", "B:D", "3:9", "C4" (lower case too); the reversed "D20:A1" is put in order.
// Refused by name: anything else, and rows or columns beyond the format's limits.
Status parse_cell_range(std::string_view text, CellRange* range);

}  // namespace tallyproof
