// The cells of one sheet as read from a workbook part (xlsx_sheets, ods_sheets), the used range
// around them, and the chosen range turned into tab-separated lines for the paste reader (one line
// per row, as a spreadsheet program copies a range of cells). Common practice of spreadsheet
// programs' copy and paste; the limits are ECMA-376 Part 1, 18.3.1.73.
#pragma once
#include <cstddef>
#include <string>
#include <vector>

#include "cell_reference.hpp"
#include "status.hpp"

namespace tallyproof {

struct SheetCell {
    std::size_t row = 0, column = 0;  // 1-based
    std::string text;                 // never empty: empty cells are not kept
};

struct SheetCells {
    std::string name;
    bool hidden = false;
    std::vector<SheetCell> cells;  // any order
    std::vector<SheetCell> formulas_without_value;  // position only (text empty): a formula never calculated and saved
    std::vector<CellRange> merged;  // merged cell ranges
};

struct WorkbookCells {
    Status status;
    std::vector<SheetCells> sheets;   // in the workbook's order
    std::vector<std::string> notes;   // about the whole workbook (macros, external links)
};

// Cells kept over all sheets of a workbook; more is refused (a sheet of repeated cells can
// otherwise expand far beyond its file's size).
inline constexpr std::size_t workbook_max_cells = 16u << 20;
// The text handed to the paste reader: at most what a paste may be.
inline constexpr std::size_t workbook_max_text_bytes = 256u << 20;

CellRange used_range(const SheetCells& sheet);  // all zero when the sheet has no cells
// The cells of `range` (closed: no side 0) as tab-separated lines; a tab or line break inside a
// cell becomes a space. Refused when the text would exceed workbook_max_text_bytes.
Status cells_as_text(SheetCells* sheet, const CellRange& range, std::string* text);
// Adds the cell to `sheet` when it is inside the format's limits and the workbook's cell budget
// (`kept` counts cells over all sheets); otherwise a refusal naming the cell.
Status keep_cell(SheetCells* sheet, std::size_t row, std::size_t column, std::string text, std::size_t* kept);

}  // namespace tallyproof
