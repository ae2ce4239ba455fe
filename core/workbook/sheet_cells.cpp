// Sheet cells to tab-separated text, as a spreadsheet program copies a range (common practice:
// one line per row, cells separated by tabs); the used range is the smallest rectangle holding
// every cell with a value (the edges' empty rows and columns trimmed).
#include "sheet_cells.hpp"

#include <algorithm>

namespace tallyproof {

CellRange used_range(const SheetCells& sheet) {
    CellRange r;
    for (const auto& c : sheet.cells) {
        if (r.first_row == 0 || c.row < r.first_row) r.first_row = c.row;
        if (c.row > r.last_row) r.last_row = c.row;
        if (r.first_column == 0 || c.column < r.first_column) r.first_column = c.column;
        if (c.column > r.last_column) r.last_column = c.column;
    }
    return r;
}

Status keep_cell(SheetCells* sheet, std::size_t row, std::size_t column, std::string text, std::size_t* kept) {
    if (row > workbook_max_rows || column > workbook_max_columns)
        return Status::failure("Sheet \"" + sheet->name + "\" has a value beyond the largest sheet a workbook may have (" +
                               std::to_string(workbook_max_rows) + " rows, " + std::to_string(workbook_max_columns) +
                               " columns): row " + std::to_string(row) + ", column " + std::to_string(column) + ".");
    if (text.empty()) return Status::success();
    if (++*kept > workbook_max_cells)
        return Status::failure("The workbook holds more than " + std::to_string(workbook_max_cells) +
                               " cells with values: too many to read here. Copy the cells you need, or save that range as CSV.");
    sheet->cells.push_back(SheetCell{row, column, std::move(text)});
    return Status::success();
}

Status cells_as_text(SheetCells* sheet, const CellRange& range, std::string* text) {
    text->clear();
    const std::size_t rows = range.last_row - range.first_row + 1, columns = range.last_column - range.first_column + 1;
    std::size_t bytes = 0;
    for (const auto& c : sheet->cells)
        if (range.contains(c.row, c.column)) bytes += c.text.size();
    // Every row has columns - 1 tabs and a line break.
    const double size = static_cast<double>(rows) * static_cast<double>(columns) + static_cast<double>(bytes);
    if (size > static_cast<double>(workbook_max_text_bytes))
        return Status::failure("The range " + range_name(range) + " of sheet \"" + sheet->name + "\" spans " + std::to_string(rows) +
                               " rows and " + std::to_string(columns) + " columns, more text than can be read (" +
                               std::to_string(workbook_max_text_bytes >> 20) + " MB). Choose a smaller range.");
    std::sort(sheet->cells.begin(), sheet->cells.end(),
              [](const SheetCell& a, const SheetCell& b) { return a.row != b.row ? a.row < b.row : a.column < b.column; });
    text->reserve(static_cast<std::size_t>(size));
    auto it = std::lower_bound(sheet->cells.begin(), sheet->cells.end(), range.first_row,
                               [](const SheetCell& c, std::size_t row) { return c.row < row; });
    for (std::size_t row = range.first_row; row <= range.last_row; ++row) {
        std::size_t column = range.first_column;
        for (; it != sheet->cells.end() && it->row == row; ++it) {
            if (it->column < range.first_column || it->column > range.last_column) continue;
            text->append(it->column - column, '\t');
            column = it->column;
            for (char ch : it->text) text->push_back(ch == '\t' || ch == '\n' || ch == '\r' ? ' ' : ch);
        }
        text->append(range.last_column - column, '\t');
        text->push_back('\n');
    }
    return Status::success();
}

}  // namespace tallyproof
